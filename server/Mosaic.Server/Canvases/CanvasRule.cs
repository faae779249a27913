using System.Globalization;
using System.Text;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Canvases;

/// <summary>
/// When a field gets a whole-field canvas: a band has more than one image HDU, or its bands' images differ in size
/// or in any WCS keyword. A field of one grid (one image per band, all alike) is shown as it is, unresampled.
/// </summary>
public static class CanvasRule
{
    // The keywords that place pixels on the sky (WCS Papers I and II, the SIP and TPV conventions); a difference in
    // any of them means the bands are on different grids.
    private static readonly string[] WcsPrefixes = ["CTYPE", "CRPIX", "CRVAL", "CDELT", "CROTA", "CD", "PC", "PV", "A_", "B_", "AP_", "BP_", "LONPOLE", "LATPOLE", "RADESYS", "EQUINOX", "EPOCH"];

    public static bool NeedsCanvas(IReadOnlyList<FieldBand> bands)
    {
        ArgumentNullException.ThrowIfNull(bands);
        if (bands.Any(b => b.Hdus.Count > 1)) return true;
        return bands.Where(b => b.Hdus.Count == 1).Select(b => Signature(b.Hdus[0])).Distinct(StringComparer.Ordinal).Count() > 1;
    }

    private static string Signature(FieldHdu hdu)
    {
        var text = new StringBuilder();
        text.Append(hdu.Plane.Width).Append('x').Append(hdu.Plane.Height);
        foreach (var card in hdu.Hdu.Header.Cards.Where(c => IsWcsKeyword(c.Keyword)).OrderBy(c => c.Keyword, StringComparer.Ordinal))
            text.Append('|').Append(card.Keyword).Append('=').Append(Convert.ToString(card.Value, CultureInfo.InvariantCulture)?.Trim());
        return text.ToString();
    }

    private static bool IsWcsKeyword(string keyword) =>
        WcsPrefixes.Any(p => keyword.StartsWith(p, StringComparison.Ordinal)
            && (p.EndsWith('_') || p.Length >= 5 || keyword.Length == p.Length || char.IsAsciiDigit(keyword[p.Length])));
}
