using Mosaic.Server.Sky;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Api;

/// <summary>Sky types to the JSON the API documents.</summary>
public static class SkyMapper
{
    // A millionth of a pixel keeps grid points on their lines far below a milliarcsecond at any sensible scale
    // while keeping the answer short.
    private const int PixelDecimals = 6;

    public static HduSkyDto? ToDto(ImageSky sky)
    {
        ArgumentNullException.ThrowIfNull(sky);
        return sky.Wcs is { } wcs ? new HduSkyDto(wcs.ProjectionCode, wcs.DistortionName, wcs.Frame.Name, sky.PixelScaleArcsec) : null;
    }

    public static SkyDto ToDto(SkyView view)
    {
        ArgumentNullException.ThrowIfNull(view);
        var sky = view.CentreSky;
        var centre = new SkyCentreDto(view.Centre.X, view.Centre.Y, sky?.RightAscension, sky?.Declination,
            sky is null ? null : SexagesimalFormatter.FormatRightAscension(sky.RightAscension),
            sky is null ? null : SexagesimalFormatter.FormatDeclination(sky.Declination));
        var o = view.Orientation;
        return new SkyDto(centre,
            o is null ? null : new VectorDto(o.North.Dx, o.North.Dy),
            o is null ? null : new VectorDto(o.East.Dx, o.East.Dy),
            view.PixelScaleArcsec,
            new GridDto(view.Grid.RaStep, view.Grid.DecStep, view.Grid.Lines.Select(ToDto).ToList()));
    }

    private static GridLineDto ToDto(GridLine line) =>
        new(line.Axis == GridAxis.Ra ? "ra" : "dec", line.Value, line.Label,
            line.Segments.Select(s => (IReadOnlyList<double[]>)s.Select(Point).ToList()).ToList(),
            line.LabelAt is { } at ? Point(at) : null);

    private static double[] Point(PixelPoint p) => [Math.Round(p.X, PixelDecimals), Math.Round(p.Y, PixelDecimals)];
}
