namespace Mosaic.Server.Views;

/// <summary>One stored view: the flat view state (parameter → value, in the order given) and what was said about it.</summary>
public sealed record SavedView(string Id, string Field, string? Title, string? Note, DateTimeOffset Created, IReadOnlyList<KeyValuePair<string, string>> State)
{
    /// <summary>The page address that opens the view: "/?" and the state as a query string, in stored order.</summary>
    public string Link => ViewState.ToLink(State);

    /// <summary>The short address that redirects to <see cref="Link"/>.</summary>
    public string Url => "/v/" + Id;
}
