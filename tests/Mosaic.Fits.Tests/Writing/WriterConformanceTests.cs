using System.Buffers.Binary;
using System.Globalization;
using System.Numerics;
using System.Text.Json;
using Mosaic.Fits.Tests.Support;
using Mosaic.Fits.Writing;
using Mosaic.Testing;

namespace Mosaic.Fits.Tests.Writing;

/// <summary>
/// Files written by FitsWriter, read by outside readers: astropy.io.fits (Debian python3-astropy) with its standard
/// verification turned into errors, and CFITSIO (Debian libcfitsio-bin fitscopy, which must parse every HDU to copy it).
/// </summary>
public sealed class WriterConformanceTests : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    private static readonly HeaderCard[] PrimaryCards =
    [
        new("OBJNAME", "synthetic field B", "a short string"),
        new("QUOTED", "it's here", null),
        // No "' " inside: astropy 5.2 misreads a quote followed by a space inside a string.
        // Trailing spaces are not significant (FITS 4.0 section 4.2.1.1), so the value has none.
        new("LONGSTR", string.Concat(Enumerable.Repeat("a long description of the synthetic field it's part of; ", 4)).TrimEnd(), "long comment"),
        new("EMPTY", "", null),
        new("FLAG", true, "logical"),
        new("COUNT", -9876543210123L, null),
        new("SMALL", 42, null),
        new("HUGEINT", BigInteger.Parse("123456789012345678901234567890", CultureInfo.InvariantCulture), null),
        new("TENTH", 0.1, null),
        new("TINY", 5e-324, null),
        new("BIGREAL", 1.7976931348623157e308, null),
        new("THIRD", 1.0 / 3.0, "needs 17 digits"),
        new("SINGLE", 0.1f, null),
        new("CPLX", new Complex(-1.25, 3), null),
        new("UNSET", null, "undefined value"),
        new("COMMENT", null, "a comment card " + new string('c', 80)),
        new("HISTORY", null, "written by the Mosaic test suite"),
        new("", null, "blank keyword text"),
    ];

    private string WriteSample(out float[] floats, out ushort[] unsigned, out double[] doubles, out int[] cube)
    {
        var path = _temp.File("written.fits");
        floats = Enumerable.Range(0, 41 * 9).Select(i => i == 7 ? float.NaN : MathF.Cos(i) * 1e4f).ToArray();
        unsigned = Enumerable.Range(0, 19 * 5).Select(i => (ushort)(i * 689)).ToArray();
        doubles = Enumerable.Range(0, 6 * 4).Select(i => Math.PI * Math.Pow(10, i - 12)).ToArray();
        cube = Enumerable.Range(0, 5 * 4 * 3).Select(i => i * 1_000_003 - 30_000_000).ToArray();

        using var writer = new FitsWriter(File.Create(path));
        writer.WriteEmptyPrimary(PrimaryCards);
        writer.WriteFloatImage([new HeaderCard("EXTNAME", "FLOATS", null), new HeaderCard("BUNIT", "counts", null)], 41, 9, floats);

        // Unsigned 16-bit by the BZERO convention (FITS 4.0 section 5.2.5): stored = value - 32768.
        var u = new byte[unsigned.Length * 2];
        for (var i = 0; i < unsigned.Length; i++) BinaryPrimitives.WriteInt16BigEndian(u.AsSpan(2 * i), (short)(unsigned[i] - 32768));
        writer.WriteRawImage([new("EXTNAME", "UINT16", null), new("BZERO", 32768L, null), new("BSCALE", 1L, null)], 16, [19, 5], u);

        var d = new byte[doubles.Length * 8];
        for (var i = 0; i < doubles.Length; i++) BinaryPrimitives.WriteDoubleBigEndian(d.AsSpan(8 * i), doubles[i]);
        writer.WriteRawImage([new("EXTNAME", "DOUBLES", null)], -64, [6, 4], d);

        var c = new byte[cube.Length * 4];
        for (var i = 0; i < cube.Length; i++) BinaryPrimitives.WriteInt32BigEndian(c.AsSpan(4 * i), cube[i]);
        writer.WriteRawImage([new("EXTNAME", "CUBE", null)], 32, [5, 4, 3], c);
        return path;
    }

    [Fact]
    public void AstropyAcceptsTheFileAndReadsOurCardsAndPixels()
    {
        var path = WriteSample(out var floats, out var unsigned, out var doubles, out var cube);
        // astropy.io.fits (Debian python3-astropy): verify('exception') with warnings as errors must pass.
        var json = Support.Astropy.Run("read_back.py", path);
        using var doc = JsonDocument.Parse(json);
        var hdus = doc.RootElement;
        Assert.Equal(5, hdus.GetArrayLength());

        var cards = hdus[0].GetProperty("cards");
        var mine = cards.EnumerateArray().Skip(4).ToArray();      // after SIMPLE, BITPIX, NAXIS, EXTEND
        var expectedCards = PrimaryCards.SelectMany(SplitCommentary).ToArray();
        Assert.Equal(expectedCards.Length, mine.Length);
        for (var i = 0; i < mine.Length; i++) AssertSameCard(expectedCards[i], mine[i]);

        Assert.Equal("FLOATS", hdus[1].GetProperty("extname").GetString());
        Assert.Equal("counts", hdus[1].GetProperty("cards").EnumerateArray().Single(c => c.GetProperty("k").GetString() == "BUNIT").GetProperty("v").GetString());
        var f = Reference.Singles(hdus[1].GetProperty("image").GetProperty("f32"));
        Assert.Equal(floats.Length, f.Length);
        for (var i = 0; i < f.Length; i++) Assert.True(Reference.SameSingle(floats[i], f[i]), $"float pixel {i}");

        // astropy applies BZERO = 32768 and hands back uint16.
        var uImage = hdus[2].GetProperty("image");
        Assert.Equal("uint16", uImage.GetProperty("dtype").GetString());
        Assert.Equal(unsigned.Select(v => (BigInteger)v), uImage.GetProperty("exact").EnumerateArray().Select(Reference.Integer));

        Assert.Equal(doubles, Reference.Reals(hdus[3].GetProperty("image").GetProperty("f64")));

        var cubeImage = hdus[4].GetProperty("image");
        Assert.Equal(5, cubeImage.GetProperty("width").GetInt32());
        Assert.Equal(cube.Take(20).Select(v => (BigInteger)v), cubeImage.GetProperty("exact").EnumerateArray().Select(Reference.Integer));
    }

    [Fact]
    public void CfitsioCopiesEveryHduAndTheCopyReadsTheSame()
    {
        var path = WriteSample(out var floats, out _, out _, out _);
        var copy = _temp.File("copied-by-cfitsio.fits");
        // CFITSIO (Debian libcfitsio-bin): fitscopy parses every header and copies every data unit; it fails on a
        // non-conforming header.
        var (code, _, stderr) = ExternalProgram.Run("/usr/bin/fitscopy", [path, copy]);
        Assert.True(code == 0, $"fitscopy refused the file written by FitsWriter: {stderr}");

        using var file = FitsFile.Open(copy);
        Assert.Equal(5, file.Hdus.Count);
        var plane = file.Hdus[1].Image!;
        var read = new float[floats.Length];
        plane.ReadRows(0, plane.Height, read);
        for (var i = 0; i < read.Length; i++) Assert.True(Reference.SameSingle(floats[i], read[i]), $"float pixel {i}");
        Assert.Equal(PrimaryCards[0].Value, file.Hdus[0].Header.GetString("OBJNAME"));
        Assert.Equal(PrimaryCards[2].Value, file.Hdus[0].Header.GetString("LONGSTR"));
    }

    /// <summary>Commentary longer than 72 characters becomes several cards (columns 9-80 each).</summary>
    private static IEnumerable<HeaderCard> SplitCommentary(HeaderCard card)
    {
        if (!card.IsCommentary || card.Comment is null || card.Comment.Length <= 72) return [card];
        return card.Comment.Chunk(72).Select(c => card with { Comment = new string(c) });
    }

    private static void AssertSameCard(HeaderCard expected, JsonElement actual)
    {
        var where = $"card {expected.Keyword}";
        Assert.Equal(expected.Keyword, actual.GetProperty("k").GetString());
        var type = actual.GetProperty("t").GetString();
        if (expected.IsCommentary)
        {
            Assert.Equal("commentary", type);
            Assert.Equal(expected.Comment, actual.GetProperty("v").GetString());
            return;
        }
        Assert.True((expected.Comment ?? "") == actual.GetProperty("c").GetString(), where + " comment");
        var v = actual.TryGetProperty("v", out var value) ? value : default;
        switch (expected.Value)
        {
            case null: Assert.Equal("undef", type); break;
            case string s: Assert.Equal("str", type); Assert.Equal(s, v.GetString()); break;
            case bool b: Assert.Equal("bool", type); Assert.Equal(b, v.GetBoolean()); break;
            case int or long or BigInteger:
                Assert.Equal("int", type);
                Assert.Equal(BigInteger.Parse(Convert.ToString(expected.Value, CultureInfo.InvariantCulture)!, CultureInfo.InvariantCulture), Reference.Integer(v));
                break;
            case double d: Assert.Equal("float", type); Assert.Equal(d, Reference.Real(v)); break;
            case float f: Assert.Equal("float", type); Assert.Equal(f, (float)Reference.Real(v)); break;
            case Complex c:
                Assert.Equal("complex", type);
                Assert.Equal(c, new Complex(Reference.Real(v[0]), Reference.Real(v[1])));
                break;
            default: throw new Xunit.Sdk.XunitException(where + ": unexpected value type");
        }
    }
}
