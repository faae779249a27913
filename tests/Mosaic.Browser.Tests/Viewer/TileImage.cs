namespace Mosaic.Browser.Tests.Viewer;

/// <summary>A tile &lt;img&gt; of the image layer as the DOM has it (settable: Playwright fills it from a JS object).</summary>
public sealed class TileImage
{
    public string Src { get; set; } = "";

    public int NaturalWidth { get; set; }

    public int NaturalHeight { get; set; }

    public bool Loaded { get; set; }

    public override string ToString() => $"{Src} ({NaturalWidth} x {NaturalHeight}{(Loaded ? ", loaded" : "")})";
}
