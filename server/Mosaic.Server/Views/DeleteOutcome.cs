namespace Mosaic.Server.Views;

/// <summary>What a delete request came to.</summary>
public enum DeleteOutcome
{
    Deleted,
    NotFound,
    WrongKey,
}
