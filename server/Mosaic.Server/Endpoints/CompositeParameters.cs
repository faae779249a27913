using System.ComponentModel;
using Microsoft.AspNetCore.Mvc;

namespace Mosaic.Server.Endpoints;

/// <summary>
/// The colour-composite query parameters of tile, render and display requests, bound as raw text so that
/// <see cref="CompositeQuery"/> can name the parameter at fault. Per-channel display overrides (rgb=each) are the
/// display parameters prefixed red-, green- or blue- and are read from the query by <see cref="CompositeQuery"/>.
/// </summary>
public sealed class CompositeParameters
{
    [FromQuery(Name = "rgb")]
    [Description("Colour composite of three bands: 'lupton' (the asinh colour-preserving composite of Lupton et al. 2004, with q, range, min, scale) or 'each' (every channel through its own display: the display parameters, resolved against the channel's own band, overridable per channel as red-lo, green-stretch, blue-hi, ...; then scale). Absent: one band as usual. 'palette' cannot be combined with it.")]
    public string? Rgb { get; set; }

    [FromQuery(Name = "red")]
    [Description("rgb: the band shown in red (case-insensitive); required with rgb.")]
    public string? Red { get; set; }

    [FromQuery(Name = "green")]
    [Description("rgb: the band shown in green; required with rgb. A band may be named twice.")]
    public string? Green { get; set; }

    [FromQuery(Name = "blue")]
    [Description("rgb: the band shown in blue; required with rgb.")]
    public string? Blue { get; set; }

    [FromQuery(Name = "q")]
    [Description("rgb=lupton: the asinh softening Q, finite and ≥ 2^-23 (values above 1e10 act as 1e10); default 8.")]
    public string? Q { get; set; }

    [FromQuery(Name = "range")]
    [Description("rgb=lupton: the linear range of the stretch (make_lupton_rgb's 'stretch'), finite and > 0; default 10 × the mean of the three bands' field-wide MAD sigma.")]
    public string? Range { get; set; }

    [FromQuery(Name = "min")]
    [Description("rgb=lupton: the value shown as black, one number for all three bands or three comma-separated (red, green, blue); default each band's field-wide median.")]
    public string? Min { get; set; }

    [FromQuery(Name = "scale")]
    [Description("rgb: three comma-separated weights > 0 (red, green, blue). lupton: multiply each band after subtracting its minimum; each: multiply each channel's stretched value before clipping to [0, 1]. Default 1,1,1.")]
    public string? Scale { get; set; }
}
