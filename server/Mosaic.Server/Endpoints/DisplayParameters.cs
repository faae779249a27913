using System.ComponentModel;
using Microsoft.AspNetCore.Mvc;

namespace Mosaic.Server.Endpoints;

/// <summary>
/// The display query parameters of tile, render, and display requests, bound as raw text so that
/// <see cref="DisplayQuery"/> can name the parameter at fault; documented in the OpenAPI document from here.
/// </summary>
public sealed class DisplayParameters
{
    [FromQuery(Name = "limits")]
    [Description("How lo/hi are chosen: auto (the default display's limits), value (lo, hi), percentile (plo, phi) or robust (klo, khi). When absent, inferred from which of those are present; mixing two kinds is an error.")]
    public string? Limits { get; set; }

    [FromQuery(Name = "lo")]
    [Description("limits=value: the physical value shown at the bottom of the scale (finite, < hi).")]
    public string? Lo { get; set; }

    [FromQuery(Name = "hi")]
    [Description("limits=value: the physical value shown at the top of the scale (finite, > lo).")]
    public string? Hi { get; set; }

    [FromQuery(Name = "plo")]
    [Description("limits=percentile: lower percentile of the band's pixels, 0 ≤ plo < phi; default 0.5.")]
    public string? Plo { get; set; }

    [FromQuery(Name = "phi")]
    [Description("limits=percentile: upper percentile, plo < phi ≤ 100; default 99.5.")]
    public string? Phi { get; set; }

    [FromQuery(Name = "klo")]
    [Description("limits=robust: lo = median − klo σ (σ the MAD sigma of the band), klo ≥ 0; default 2.")]
    public string? Klo { get; set; }

    [FromQuery(Name = "khi")]
    [Description("limits=robust: hi = median + khi σ, khi > 0; default 20.")]
    public string? Khi { get; set; }

    [FromQuery(Name = "stretch")]
    [Description("Transfer function: linear, sqrt, power, log, asinh or histeq; default asinh.")]
    public string? Stretch { get; set; }

    [FromQuery(Name = "gamma")]
    [Description("stretch=power: the exponent, > 0; default 2.")]
    public string? Gamma { get; set; }

    [FromQuery(Name = "a")]
    [Description("stretch=log: t = ln(1 + a u) / ln(1 + a), a > 0; default 1000.")]
    public string? A { get; set; }

    [FromQuery(Name = "soft")]
    [Description("stretch=asinh: softening in physical units, > 0; default 3 × the band's MAD sigma.")]
    public string? Soft { get; set; }

    [FromQuery(Name = "pivot")]
    [Description("stretch=asinh: the pivot c, a finite physical value, 'lo' or 'median' (the band's field-wide median); default lo.")]
    public string? Pivot { get; set; }

    [FromQuery(Name = "palette")]
    [Description("Palette: gray, gray-inv, cubehelix or one of the names GET /api/palettes lists; default gray.")]
    public string? Palette { get; set; }

    [FromQuery(Name = "ch-start")]
    [Description("palette=cubehelix: start colour, 0 to 3; default 0.5.")]
    public string? CubehelixStart { get; set; }

    [FromQuery(Name = "ch-rot")]
    [Description("palette=cubehelix: rotations, −10 to 10; default −1.5.")]
    public string? CubehelixRotations { get; set; }

    [FromQuery(Name = "ch-hue")]
    [Description("palette=cubehelix: hue (colour amplitude), 0 to 3; default 1.")]
    public string? CubehelixHue { get; set; }

    [FromQuery(Name = "ch-gamma")]
    [Description("palette=cubehelix: gamma, > 0 and ≤ 10; default 1.")]
    public string? CubehelixGamma { get; set; }

    [FromQuery(Name = "masked")]
    [Description("Colour of masked pixels (NaN or BLANK): 'transparent' or six hex digits rrggbb without '#'. Default: transparent for tiles, the palette's own masked colour for render.png.")]
    public string? Masked { get; set; }
}
