namespace Mosaic.Browser.Tests.Viewer;

/// <summary>One saved view as the share panel lists it; <see cref="Href"/> is the link its title opens.</summary>
public sealed record SavedViewEntry(string Id, string Title, string Note, bool CanDelete, string Href);
