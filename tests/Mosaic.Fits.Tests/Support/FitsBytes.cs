using System.Text;

namespace Mosaic.Fits.Tests.Support;

/// <summary>Builds FITS files byte by byte, so tests control every record, including broken ones.</summary>
public sealed class FitsBytes
{
    private readonly List<byte> _bytes = [];

    /// <summary>"KEYWORD = value" with the keyword in columns 1-8 and the value from column 11.</summary>
    public static string Card(string keyword, string value) => keyword.PadRight(8) + "= " + value;

    /// <summary>The mandatory records of a primary HDU (FITS 4.0 section 4.4.1.1).</summary>
    public static string[] Primary(int bitPix, params long[] axes) =>
    [
        Card("SIMPLE", "T".PadLeft(20)),
        Card("BITPIX", bitPix.ToString().PadLeft(20)),
        Card("NAXIS", axes.Length.ToString().PadLeft(20)),
        .. axes.Select((n, i) => Card($"NAXIS{i + 1}", n.ToString().PadLeft(20))),
    ];

    /// <summary>The mandatory records of an extension (FITS 4.0 section 7.1).</summary>
    public static string[] Extension(string type, int bitPix, long pCount, long gCount, params long[] axes) =>
    [
        Card("XTENSION", $"'{type.PadRight(8)}'"),
        Card("BITPIX", bitPix.ToString().PadLeft(20)),
        Card("NAXIS", axes.Length.ToString().PadLeft(20)),
        .. axes.Select((n, i) => Card($"NAXIS{i + 1}", n.ToString().PadLeft(20))),
        Card("PCOUNT", pCount.ToString().PadLeft(20)),
        Card("GCOUNT", gCount.ToString().PadLeft(20)),
    ];

    /// <summary>Records, then END, then spaces to the end of the 2880-byte block.</summary>
    public FitsBytes Header(params string[] records) => HeaderWithoutEnd([.. records, "END"]).PadTo(2880, (byte)' ');

    public FitsBytes HeaderWithoutEnd(params string[] records)
    {
        foreach (var r in records)
        {
            if (r.Length > 80) throw new ArgumentException($"record longer than 80: {r}");
            _bytes.AddRange(Encoding.Latin1.GetBytes(r.PadRight(80)));
        }
        return this;
    }

    /// <summary>Data bytes, then zeros to the end of the block.</summary>
    public FitsBytes Data(ReadOnlySpan<byte> data)
    {
        _bytes.AddRange(data.ToArray());
        return PadTo(2880, 0);
    }

    public FitsBytes Raw(ReadOnlySpan<byte> bytes)
    {
        _bytes.AddRange(bytes.ToArray());
        return this;
    }

    public FitsBytes PadTo(int block, byte fill)
    {
        while (_bytes.Count % block != 0) _bytes.Add(fill);
        return this;
    }

    public byte[] ToArray() => [.. _bytes];

    public string WriteTo(string path)
    {
        File.WriteAllBytes(path, ToArray());
        return path;
    }
}
