namespace Mosaic.Imaging.Composite;

/// <summary>The channel names as query parameters and messages spell them.</summary>
public static class ChannelNames
{
    public const string Red = "red";
    public const string Green = "green";
    public const string Blue = "blue";

    public static Channels<string> All { get; } = new(Red, Green, Blue);
}
