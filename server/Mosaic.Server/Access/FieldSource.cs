namespace Mosaic.Server.Access;

/// <summary>Where in the request the field was named; decides how a hidden one is answered.</summary>
public enum FieldSource
{
    /// <summary>The {field} of the route: 404 "no field".</summary>
    Route,

    /// <summary>?field= of the saved-view listing: an empty list, as for a field with no views.</summary>
    ViewListing,

    /// <summary>The field of the saved view {id}: 404 "no saved view".</summary>
    SavedView,
}
