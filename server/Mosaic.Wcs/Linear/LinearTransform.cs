using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Linear;

/// <summary>
/// Pixel to intermediate world coordinates and back (Paper I eq. 1 with the CD form): x_i = sum_j CD_ij (p_j - r_j),
/// on 1-based FITS pixel coordinates, intermediate coordinates in degrees.
/// </summary>
public sealed class LinearTransform
{
    private readonly double _r1, _r2, _m11, _m12, _m21, _m22, _i11, _i12, _i21, _i22;

    public LinearTransform(WcsHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        _r1 = header.CrPix1; _r2 = header.CrPix2;
        _m11 = header.Cd11; _m12 = header.Cd12; _m21 = header.Cd21; _m22 = header.Cd22;
        var det = _m11 * _m22 - _m12 * _m21;
        _i11 = _m22 / det; _i12 = -_m12 / det; _i21 = -_m21 / det; _i22 = _m11 / det;
    }

    /// <summary>Offsets from the reference pixel (p - r), both 1-based, to intermediate degrees.</summary>
    public (double X, double Y) OffsetToIntermediate(double dx, double dy) =>
        (_m11 * dx + _m12 * dy, _m21 * dx + _m22 * dy);

    public (double Dx, double Dy) IntermediateToOffset(double x, double y) =>
        (_i11 * x + _i12 * y, _i21 * x + _i22 * y);

    public double CrPix1 => _r1;
    public double CrPix2 => _r2;

    public (double X, double Y) PixelToIntermediate(double pixel1, double pixel2) =>
        OffsetToIntermediate(pixel1 - _r1, pixel2 - _r2);

    public (double Pixel1, double Pixel2) IntermediateToPixel(double x, double y)
    {
        var (dx, dy) = IntermediateToOffset(x, y);
        return (dx + _r1, dy + _r2);
    }
}
