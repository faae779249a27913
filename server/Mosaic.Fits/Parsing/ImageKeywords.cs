using Microsoft.Win32.SafeHandles;

namespace Mosaic.Fits.Parsing;

/// <summary>BSCALE, BZERO and BLANK of an image HDU (FITS 4.0 sections 4.4.2.5 and 5.3), and the plane they describe.</summary>
internal static class ImageKeywords
{
    public static ImagePlane? PlaneOf(HduLayout layout, Header header, SafeFileHandle handle, long dataOffset, in ParseContext context)
    {
        if (!layout.HoldsImage || layout.Axes.Length < 2) return null;
        var width = layout.Axes[0];
        var height = layout.Axes[1];
        if (width == 0 || height == 0) return null;
        if (width > int.MaxValue) throw context.Error("NAXIS1", $"NAXIS1 = {width} is wider than this reader serves ({int.MaxValue} columns)");
        if (height > int.MaxValue) throw context.Error("NAXIS2", $"NAXIS2 = {height} is taller than this reader serves ({int.MaxValue} rows)");

        var bScale = Real(header, "BSCALE", 1.0, context);
        if (bScale == 0) throw context.Error("BSCALE", "BSCALE = 0 would make every pixel equal to BZERO (section 4.4.2.5)");
        var bZero = Real(header, "BZERO", 0.0, context);

        long? blank = null;
        if (layout.BitPix > 0 && header.Find("BLANK") is { } card)
        {
            if (card.Value is not long b)
                throw context.Error("BLANK", "BLANK must be an integer (section 4.4.2.5)");
            blank = b;
        }
        // BLANK on floating-point data is not allowed and is ignored: NaN marks missing values there (section 5.3).

        return new RawImagePlane(handle, context.FilePath, context.HduIndex, layout.BitPix, (int)width, (int)height,
            bScale, bZero, blank, dataOffset);
    }

    private static double Real(Header header, string keyword, double fallback, in ParseContext context)
    {
        var card = header.Find(keyword);
        if (card is null) return fallback;
        var value = header.GetDouble(keyword);
        if (value is not double d || !double.IsFinite(d))
            throw context.Error(keyword, $"{keyword} must be a finite number (section 4.4.2.5)");
        return d;
    }
}
