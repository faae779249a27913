using System.Globalization;
using System.Numerics;
using System.Text.Json;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Astropy;

/// <summary>Every header card of every astropy-written file, compared with what astropy.io.fits (Debian python3-astropy) parses.</summary>
[Collection(AstropyCollection.Name)]
public sealed class HeaderCardTests(AstropyReferenceFiles files)
{
    [Fact]
    public void EveryCardMatchesAstropy()
    {
        var compared = 0;
        foreach (var name in files.Names)
        {
            var expected = files.Hdus(name);
            using var file = FitsFile.Open(files.PathOf(name));
            for (var h = 0; h < file.Hdus.Count; h++)
            {
                var wantCards = expected[h].GetProperty("cards");
                var cards = file.Hdus[h].Header.Cards;
                Assert.Equal(wantCards.GetArrayLength(), cards.Count);
                for (var i = 0; i < cards.Count; i++)
                {
                    AssertCard(wantCards[i], cards[i], $"{name} HDU {h} card {i + 1}");
                    compared++;
                }
            }
        }
        Assert.True(compared > 200, $"only {compared} cards compared");
    }

    [Fact]
    public void SpecialCardsOfTheHeaderFile()
    {
        using var file = FitsFile.Open(files.PathOf("header.fits"));
        var header = file.Hdus[0].Header;
        // Values as astropy.io.fits (Debian python3-astropy) reads them, spelled out for the cases the issue lists.
        Assert.Equal(BigInteger.Parse("123456789012345678901234567890", CultureInfo.InvariantCulture), header.Find("BIGINT")!.Value);
        Assert.Equal(long.MaxValue, header.GetLong("INT64"));
        Assert.Equal(1250.0, header.GetDouble("DEXP"));
        Assert.Equal(1.75, header.GetDouble("MOSAIC CAMERA GAIN"));
        Assert.Equal("e-/ADU", header.Find("MOSAIC CAMERA GAIN")!.Comment);
        Assert.Equal(new string('x', 150), header.GetString("LONGNC"));
        Assert.Null(header.Find("UNDEF")!.Value);
        Assert.False(header.Find("UNDEF")!.IsCommentary);
        Assert.True(header.Cards.Single(c => c.Keyword == "NOVALUE").IsCommentary);
        Assert.False(header.Contains("NOVALUE"));
    }

    private static void AssertCard(JsonElement want, HeaderCard card, string where)
    {
        var type = want.GetProperty("t").GetString();
        Assert.True(want.GetProperty("k").GetString() == card.Keyword, $"{where}: keyword astropy '{want.GetProperty("k").GetString()}', Mosaic '{card.Keyword}'");
        if (type == "commentary")
        {
            Assert.True(card.IsCommentary, $"{where} ({card.Keyword}) should be commentary");
            Assert.Equal(want.GetProperty("v").GetString(), card.Comment ?? "");
            return;
        }
        Assert.False(card.IsCommentary, $"{where} ({card.Keyword}) should not be commentary");
        Assert.True(want.GetProperty("c").GetString() == (card.Comment ?? ""), $"{where} ({card.Keyword}): comment astropy '{want.GetProperty("c").GetString()}', Mosaic '{card.Comment}'");
        var v = want.TryGetProperty("v", out var value) ? value : default;
        switch (type)
        {
            case "undef": Assert.Null(card.Value); break;
            case "bool": Assert.Equal(v.GetBoolean(), Assert.IsType<bool>(card.Value)); break;
            case "str": Assert.Equal(v.GetString(), Assert.IsType<string>(card.Value)); break;
            case "int":
                var integer = card.Value switch
                {
                    long l => new BigInteger(l),
                    BigInteger b => b,
                    _ => throw new Xunit.Sdk.XunitException($"{where} ({card.Keyword}): expected an integer, got {card.Value?.GetType().Name}"),
                };
                Assert.Equal(Reference.Integer(v), integer);
                // Integers that fit 64 bits must come back as long, so Header.GetLong finds them.
                Assert.Equal(integer >= long.MinValue && integer <= long.MaxValue, card.Value is long);
                break;
            case "float": Assert.Equal(Reference.Real(v), Assert.IsType<double>(card.Value)); break;
            case "complex":
                Assert.Equal(new Complex(Reference.Real(v[0]), Reference.Real(v[1])), Assert.IsType<Complex>(card.Value));
                break;
            default: throw new Xunit.Sdk.XunitException($"{where}: unknown reference type {type}");
        }
    }
}
