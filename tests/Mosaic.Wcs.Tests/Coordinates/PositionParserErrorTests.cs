using Mosaic.Wcs.Coordinates;

namespace Mosaic.Wcs.Tests.Coordinates;

public sealed class PositionParserErrorTests
{
    /// <summary>Bad text and a word the message must contain, so the user learns what was wrong.</summary>
    public static TheoryData<string, string> Cases() => new()
    {
        { "", "no position" },
        { "   ", "no position" },
        { "188.736", "only one coordinate" },
        { "12:34:56.7", "only one coordinate" },
        { "12:60:00 +10:00:00", "minutes" },
        { "12:34:60 +10:00:00", "seconds" },
        { "12:00:00 +10:75:00", "minutes" },
        { "24:00:00 +10:00:00", "hours must be below 24" },
        { "25h00m00s +10d", "hours must be below 24" },
        { "12:00:00 +90:00:00.1", "must not exceed 90" },
        { "10 -91", "must not exceed 90" },
        { "360 10", "below 360" },
        { "-10 10", "RA cannot be negative" },
        { "-12:00:00 +10:00:00", "RA cannot be negative" },
        { "abc def", "expected a number" },
        { "12:34:56.7 -01:02:03 junk", "unexpected" },
        { "12x 10", "unexpected 'x'" },
        { "1.2.3 4", "malformed number" },
        { "12:34: +10:00:00", "colon" },
        { "12:34:56.7 -01:02:", "colon" },
        { "1,2,3", "more than one comma" },
        { ",10", "comma" },
        { "1 2 3 4", "could not tell RA from Dec" },
        { "12:34.5:56 +10:00:00", "fraction" },
        { "12 34 56.7 -01 -02 03", "only the first field may carry a sign" },
        { "12:34:56.7 -01:-02:03", "colon" },
        { "10 20, 30", "separate values" },
        { "12:00:00 10h", "Dec cannot be given in hours" },
        { "30m20s 10", "hours or degrees field is missing" },
        { "12:34:56s 10", "cannot mix" },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Rejects_bad_text_with_a_message_saying_why(string text, string expectedInMessage)
    {
        var error = Assert.Throws<PositionFormatException>(() => PositionParser.Parse(text));
        Assert.Contains(expectedInMessage, error.Message, StringComparison.OrdinalIgnoreCase);
        Assert.False(PositionParser.TryParse(text, out _));
    }

    [Fact]
    public void Null_text_is_an_argument_error()
    {
        Assert.Throws<ArgumentNullException>(() => PositionParser.Parse(null!));
    }
}
