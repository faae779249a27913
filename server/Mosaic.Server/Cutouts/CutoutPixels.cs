using System.Buffers.Binary;
using System.Runtime.InteropServices;
using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Server.Fields;
using Mosaic.Server.Regions;

namespace Mosaic.Server.Cutouts;

/// <summary>
/// Reads a cutout's rows as the big-endian samples it is written with. An uncompressed chip is copied byte for byte
/// (same BITPIX, BSCALE, BZERO and BLANK); a tile-compressed integer chip keeps its ZBITPIX and scaling, its stored
/// integers recovered from the decoded values; a quantised or lossless float chip and the canvas give physical
/// floats.
/// </summary>
public sealed class CutoutPixels
{
    private enum Path
    {
        /// <summary>The stored bytes of an uncompressed image.</summary>
        Stored,

        /// <summary>Physical values as float32 (a floating-point compressed image, the canvas).</summary>
        Floats,

        /// <summary>Integers of 8 or 16 bits with BSCALE 1 and a whole BZERO: exact through float32.</summary>
        SmallIntegers,

        /// <summary>Anything else compressed: through double, exact for 32-bit integers and doubles.</summary>
        Doubles,
    }

    private readonly ImagePlane _plane;
    private readonly Path _path;
    private readonly double _bScale;
    private readonly double _bZero;
    private readonly long? _blank;

    private CutoutPixels(ImagePlane plane, Path path, int bitPix, double bScale, double bZero, long? blank)
    {
        _plane = plane; _path = path; BitPix = bitPix; _bScale = bScale; _bZero = bZero; _blank = blank;
    }

    /// <summary>BITPIX of the cutout.</summary>
    public int BitPix { get; }

    public int BytesPerSample => Math.Abs(BitPix) / 8;

    /// <summary>True where the values are written as physical floats, so the source's BSCALE, BZERO and BLANK no longer apply.</summary>
    public bool PhysicalFloats => _path == Path.Floats || (_path == Path.Doubles && BitPix < 0);

    public static CutoutPixels For(FieldHdu hdu)
    {
        ArgumentNullException.ThrowIfNull(hdu);
        var plane = hdu.Plane;
        if (plane is RawImagePlane raw) return new CutoutPixels(plane, Path.Stored, raw.BitPix, raw.BScale, raw.BZero, raw.Blank);
        if (hdu.IsCanvas || plane.BitPix == -32) return new CutoutPixels(plane, Path.Floats, -32, 1, 0, null);
        var header = hdu.Hdu.Header;
        var bScale = header.GetDouble("BSCALE") ?? 1.0;
        var bZero = header.GetDouble("BZERO") ?? 0.0;
        var blank = plane.BitPix > 0 ? header.GetLong("BLANK") : null;
        var small = plane.BitPix is 8 or 16 && bScale == 1 && bZero == Math.Floor(bZero) && Math.Abs(bZero) < 1 << 20;
        return new CutoutPixels(plane, small ? Path.SmallIntegers : Path.Doubles, plane.BitPix, bScale, bZero, blank);
    }

    /// <summary>
    /// Rows [first, first + rows) of the box counted from its bottom (row 0 is FITS y = box.Y0), into destination
    /// (rows x box.Width samples); <paramref name="scratch"/> holds at least box.Width floats.
    /// </summary>
    public void ReadRows(PixelBox box, int first, int rows, Span<byte> destination, Span<float> scratch)
    {
        var width = box.Width;
        var rowBytes = width * BytesPerSample;
        for (var k = 0; k < rows; k++)
        {
            var y = box.Y0 - 1 + first + k;
            var target = destination.Slice(k * rowBytes, rowBytes);
            switch (_path)
            {
                case Path.Stored:
                    StoredSamples.ReadRow((RawImagePlane)_plane, y, box.X0 - 1, target);
                    break;
                case Path.Floats:
                {
                    var values = scratch[..width];
                    _plane.ReadRow(y, box.X0 - 1, values);
                    BinaryPrimitives.ReverseEndianness(MemoryMarshal.Cast<float, uint>(values), MemoryMarshal.Cast<byte, uint>(target));
                    break;
                }
                case Path.SmallIntegers:
                {
                    var values = scratch[..width];
                    _plane.ReadRow(y, box.X0 - 1, values);
                    for (var i = 0; i < width; i++) WriteInteger(target, i, StoredInteger(values[i]));
                    break;
                }
                default:
                    // Doubles keep 32-bit integers exact; the per-pixel read is the price of exactness on this rare path.
                    for (var i = 0; i < width; i++)
                    {
                        var value = _plane.ReadValue(box.X0 - 1 + i, y);
                        if (BitPix == -64) BinaryPrimitives.WriteDoubleBigEndian(target[(i * 8)..], value);
                        else if (BitPix == -32) BinaryPrimitives.WriteSingleBigEndian(target[(i * 4)..], (float)value);
                        else WriteInteger(target, i, StoredInteger(value));
                    }
                    break;
            }
        }
    }

    /// <summary>The stored integer a physical value came from (FITS 4.0 section 4.4.2.5: physical = BZERO + BSCALE x stored); BLANK for NaN.</summary>
    private long StoredInteger(double physical)
    {
        if (double.IsNaN(physical)) return _blank ?? Minimum;
        var stored = Math.Round((physical - _bZero) / _bScale);
        return (long)Math.Clamp(stored, Minimum, Maximum);
    }

    private long Minimum => BitPix switch { 8 => 0, 16 => short.MinValue, 32 => int.MinValue, _ => long.MinValue };

    private long Maximum => BitPix switch { 8 => 255, 16 => short.MaxValue, 32 => int.MaxValue, _ => long.MaxValue };

    private void WriteInteger(Span<byte> row, int index, long value)
    {
        switch (BitPix)
        {
            case 8: row[index] = (byte)value; break;
            case 16: BinaryPrimitives.WriteInt16BigEndian(row[(index * 2)..], (short)value); break;
            case 32: BinaryPrimitives.WriteInt32BigEndian(row[(index * 4)..], (int)value); break;
            default: BinaryPrimitives.WriteInt64BigEndian(row[(index * 8)..], value); break;
        }
    }
}
