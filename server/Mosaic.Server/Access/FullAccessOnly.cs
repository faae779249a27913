namespace Mosaic.Server.Access;

/// <summary>Endpoint metadata: only a caller with an access token may call it (making share links).</summary>
public sealed class FullAccessOnly
{
    public static readonly FullAccessOnly Instance = new();

    private FullAccessOnly()
    {
    }
}
