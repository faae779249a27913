using System.Globalization;
using System.Text.RegularExpressions;
using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Server.Cutouts;

/// <summary>
/// The header of a cutout: the source's own cards without the structural ones the writer puts itself, CRPIX (and
/// IRAF's LTV) shifted by the box origin so every pixel keeps its sky position — SIP and TPV coefficients are
/// relative to CRPIX and stay as they are (Shupe et al. 2005; FITS WCS Paper II) —, EXTNAME, DATE and HISTORY
/// cards saying where the pixels came from.
/// </summary>
public static partial class CutoutHeader
{
    /// <summary>Written by the FITS writer, stale after a cut (checksums), or part of tile compression (FITS 4.0 section 10.1).</summary>
    private static readonly HashSet<string> Dropped = new(StringComparer.Ordinal)
    {
        "SIMPLE", "XTENSION", "BITPIX", "NAXIS", "PCOUNT", "GCOUNT", "EXTEND", "GROUPS", "END", "INHERIT",
        "CHECKSUM", "DATASUM", "DATE",
        "ZIMAGE", "ZCMPTYPE", "ZBITPIX", "ZNAXIS", "ZMASKCMP", "ZSIMPLE", "ZTENSION", "ZEXTEND", "ZBLOCKED", "ZPCOUNT",
        "ZGCOUNT", "ZHECKSUM", "ZDATASUM", "ZQUANTIZ", "ZDITHER0", "ZSCALE", "ZZERO", "ZBLANK",
    };

    /// <summary>Keywords that no longer apply once values are written as physical floats.</summary>
    private static readonly HashSet<string> Scaling = new(StringComparer.Ordinal) { "BSCALE", "BZERO", "BLANK" };

    [GeneratedRegex("^(NAXIS|ZNAXIS|ZTILE|ZNAME|ZVAL)[0-9]+$")]
    private static partial Regex IndexedStructure();

    [GeneratedRegex("^CRPIX([12])[A-Z]?$")]
    private static partial Regex ReferencePixel();

    [GeneratedRegex("^LTV([12])$")]
    private static partial Regex IrafOffset();

    /// <param name="physicalFloats">True where the data are written as physical values (BITPIX -32), so BSCALE, BZERO and BLANK go.</param>
    /// <param name="history">What the cutout was cut from, one line per HISTORY card.</param>
    /// <param name="unit">BUNIT to add where the source has none (the canvas's header carries only its grid).</param>
    public static List<HeaderCard> Build(Header source, string chipName, int x0, int y0, bool physicalFloats,
        IReadOnlyList<string> history, string? unit, DateTime nowUtc)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(history);
        double dx = x0 - 1, dy = y0 - 1;
        var cards = new List<HeaderCard>(source.Cards.Count + history.Count + 4);
        bool hasCrPix1 = false, hasCrPix2 = false;
        foreach (var card in source.Cards)
        {
            var k = card.Keyword;
            if (!card.IsCommentary && (Dropped.Contains(k) || IndexedStructure().IsMatch(k) || (physicalFloats && Scaling.Contains(k))))
                continue;
            var shifted = card;
            var m = ReferencePixel().Match(k);
            if (!m.Success) m = IrafOffset().Match(k);
            if (!card.IsCommentary && m.Success)
            {
                var axis = m.Groups[1].Value == "1" ? dx : dy;
                if (card.Value is double or long)
                    shifted = card with { Value = Convert.ToDouble(card.Value, CultureInfo.InvariantCulture) - axis };
                if (k == "CRPIX1") hasCrPix1 = true;
                if (k == "CRPIX2") hasCrPix2 = true;
            }
            if (CardCheck.Writable(shifted) is { } writable) cards.Add(writable);
        }
        // CRPIXj defaults to 0 (WCS Paper I, section 2.1.2): a WCS without it still needs the shift written out.
        var hasWcs = source.Contains("CTYPE1") || source.Contains("CTYPE2");
        if (hasWcs && !hasCrPix1) cards.Add(new HeaderCard("CRPIX1", 0.0 - dx, "reference pixel, shifted to the cutout"));
        if (hasWcs && !hasCrPix2) cards.Add(new HeaderCard("CRPIX2", 0.0 - dy, "reference pixel, shifted to the cutout"));
        if (!source.Contains("EXTNAME") && CardCheck.Writable(new HeaderCard("EXTNAME", chipName, "image the cutout was cut from")) is { } name)
            cards.Add(name);
        if (!source.Contains("BUNIT") && unit is not null && CardCheck.Writable(new HeaderCard("BUNIT", unit, "physical unit of the values")) is { } bunit)
            cards.Add(bunit);
        cards.Add(new HeaderCard("DATE", nowUtc.ToString("yyyy-MM-dd'T'HH:mm:ss", CultureInfo.InvariantCulture), "UTC date this cutout was written"));
        foreach (var line in history)
            cards.Add(new HeaderCard("HISTORY", null, Printable(line)) { NoValueIndicator = true });
        return cards;
    }

    /// <summary>Header text is printable ASCII only (FITS 4.0 section 4.1.1): anything else in a name becomes '?'.</summary>
    public static string Printable(string text) => string.Concat(text.Select(c => c is >= ' ' and <= '~' ? c : '?'));
}
