using System.Globalization;
using Mosaic.Server.Errors;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Endpoints;

/// <summary>
/// What a probe asks for: a pixel (x, y), or a sky position given as ra/dec in decimal degrees or as typed text
/// in 'position'. Mixing the forms is an error naming the parameter that does not belong.
/// </summary>
public sealed record ProbeQuery(double X, double Y, SkyPosition? Sky, string? SkyParameter)
{
    /// <exception cref="MosaicRequestException">A parameter is missing, malformed, out of range or mixed with another form.</exception>
    /// <exception cref="PositionFormatException">'position' is not a sky position.</exception>
    public static ProbeQuery Parse(string? x, string? y, string? ra, string? dec, string? position)
    {
        bool hasPixel = Given(x) || Given(y), hasRaDec = Given(ra) || Given(dec), hasText = Given(position);
        if (hasPixel && (hasRaDec || hasText))
        {
            var culprit = hasText ? "position" : Given(ra) ? "ra" : "dec";
            throw MosaicRequestException.BadParameter(culprit, $"Give a pixel (x, y) or a sky position (ra and dec, or position), not both: '{culprit}' was given with '{(Given(x) ? "x" : "y")}'.");
        }
        if (hasRaDec && hasText)
            throw MosaicRequestException.BadParameter("position", "Give the sky position either as 'ra' and 'dec' or as 'position', not both.");
        if (hasText)
            return new ProbeQuery(double.NaN, double.NaN, PositionParser.Parse(position!), "position");
        if (hasRaDec)
        {
            var raDegrees = QueryParameters.RequiredFinite("ra", ra);
            var decDegrees = QueryParameters.RequiredFinite("dec", dec);
            if (raDegrees < 0 || raDegrees > 360)
                throw MosaicRequestException.BadParameter("ra", $"'ra' = {Text(raDegrees)} is out of range: RA is given in decimal degrees from 0 to 360.");
            if (decDegrees < -90 || decDegrees > 90)
                throw MosaicRequestException.BadParameter("dec", $"'dec' = {Text(decDegrees)} is out of range: Dec is given in decimal degrees from -90 to +90.");
            return new ProbeQuery(double.NaN, double.NaN, new SkyPosition(raDegrees, decDegrees), "ra");
        }
        return new ProbeQuery(QueryParameters.RequiredFinite("x", x), QueryParameters.RequiredFinite("y", y), null, null);
    }

    private static bool Given(string? text) => !string.IsNullOrWhiteSpace(text);

    private static string Text(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
