namespace Mosaic.Server.Access;

/// <summary>
/// The fields the current request's caller may not see, for the field catalog: a field named in a body (a saved
/// view's or a meeting's state) is then "not there" exactly as one named in the route. Empty outside requests
/// (pyramid building and other background work see every field).
/// </summary>
public static class FieldScope
{
    private static readonly AsyncLocal<Func<string, bool>?> Hidden = new();

    public static bool IsHidden(string fieldId) => Hidden.Value?.Invoke(fieldId) == true;

    internal static void Set(Func<string, bool>? hidden) => Hidden.Value = hidden;
}
