using System.Buffers.Binary;
using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Mosaic.Fits.Pixels;

/// <summary>
/// Big-endian stored samples (FITS 4.0 section 5.2) to physical float values, vectorised with a scalar tail.
/// The source is byte-swapped in place, so it must be scratch memory.
/// </summary>
internal static class SampleDecoder
{
    private const double TwoPow31 = 2147483648.0;

    public static void Decode(int bitPix, Span<byte> bigEndian, Span<float> destination, in SampleScaling scaling)
    {
        switch (bitPix)
        {
            case 8: DecodeBytes(bigEndian, destination, scaling); break;
            case 16: DecodeInt16(MemoryMarshal.Cast<byte, short>(bigEndian), destination, scaling); break;
            case 32: DecodeInt32(MemoryMarshal.Cast<byte, int>(bigEndian), destination, scaling); break;
            case 64: DecodeInt64(MemoryMarshal.Cast<byte, long>(bigEndian), destination, scaling); break;
            case -32: DecodeFloat32(MemoryMarshal.Cast<byte, float>(bigEndian), destination, scaling); break;
            case -64: DecodeFloat64(MemoryMarshal.Cast<byte, double>(bigEndian), destination, scaling); break;
            default: throw new ArgumentOutOfRangeException(nameof(bitPix), bitPix, "unsupported BITPIX");
        }
    }

    /// <summary>One physical value in double precision; NaN where masked.</summary>
    public static double DecodeOne(int bitPix, ReadOnlySpan<byte> bigEndian, in SampleScaling s)
    {
        switch (bitPix)
        {
            case -32:
                // Identity returns the stored float itself, so -0 stays -0 as in the row reads.
                var f = BinaryPrimitives.ReadSingleBigEndian(bigEndian);
                return s.Mode == ScalingMode.Identity ? f : s.BZero + s.BScale * f;
            case -64:
                var d = BinaryPrimitives.ReadDoubleBigEndian(bigEndian);
                return s.Mode == ScalingMode.Identity ? d : s.BZero + s.BScale * d;
        }
        long stored = bitPix switch
        {
            8 => bigEndian[0],
            16 => BinaryPrimitives.ReadInt16BigEndian(bigEndian),
            32 => BinaryPrimitives.ReadInt32BigEndian(bigEndian),
            _ => BinaryPrimitives.ReadInt64BigEndian(bigEndian),
        };
        if (s.HasBlank && stored == s.Blank) return double.NaN;
        return s.Mode switch
        {
            ScalingMode.Identity => stored,
            ScalingMode.IntegerOffset => ExactConversion.ToDouble(stored + s.IntegerZero),
            _ => s.BZero + s.BScale * stored,
        };
    }

    private static void DecodeBytes(ReadOnlySpan<byte> source, Span<float> destination, in SampleScaling s)
    {
        var n = source.Length;
        var i = 0;
        if (Vector.IsHardwareAccelerated)
        {
            var k = new IntKernel(s);
            var lanes = Vector<int>.Count;
            for (; i <= n - Vector<byte>.Count; i += Vector<byte>.Count)
            {
                var v = Vector.LoadUnsafe(ref MemoryMarshal.GetReference(source), (nuint)i);
                Vector.Widen(v, out Vector<ushort> a, out Vector<ushort> b);
                Vector.Widen(a, out Vector<uint> a0, out Vector<uint> a1);
                Vector.Widen(b, out Vector<uint> b0, out Vector<uint> b1);
                k.Apply(Vector.AsVectorInt32(a0)).CopyTo(destination.Slice(i));
                k.Apply(Vector.AsVectorInt32(a1)).CopyTo(destination.Slice(i + lanes));
                k.Apply(Vector.AsVectorInt32(b0)).CopyTo(destination.Slice(i + 2 * lanes));
                k.Apply(Vector.AsVectorInt32(b1)).CopyTo(destination.Slice(i + 3 * lanes));
            }
        }
        for (; i < n; i++) destination[i] = ScalarSmall(source[i], s);
    }

    private static void DecodeInt16(Span<short> source, Span<float> destination, in SampleScaling s)
    {
        BinaryPrimitives.ReverseEndianness(source, source);
        var n = source.Length;
        var i = 0;
        if (Vector.IsHardwareAccelerated)
        {
            var k = new IntKernel(s);
            var lanes = Vector<int>.Count;
            for (; i <= n - Vector<short>.Count; i += Vector<short>.Count)
            {
                var v = Vector.LoadUnsafe(ref MemoryMarshal.GetReference(source), (nuint)i);
                Vector.Widen(v, out Vector<int> a, out Vector<int> b);
                k.Apply(a).CopyTo(destination.Slice(i));
                k.Apply(b).CopyTo(destination.Slice(i + lanes));
            }
        }
        for (; i < n; i++) destination[i] = ScalarSmall(source[i], s);
    }

    private static void DecodeInt32(Span<int> source, Span<float> destination, in SampleScaling s)
    {
        BinaryPrimitives.ReverseEndianness(source, source);
        var n = source.Length;
        var i = 0;
        var unsigned = s.Mode == ScalingMode.IntegerOffset && s.BZero == TwoPow31;
        if (Vector.IsHardwareAccelerated)
        {
            var k = new IntKernel(s);
            var sign = new Vector<int>(int.MinValue);
            var blank = new Vector<int>((int)s.Blank);
            var nan = new Vector<float>(float.NaN);
            for (; i <= n - Vector<int>.Count; i += Vector<int>.Count)
            {
                var v = Vector.LoadUnsafe(ref MemoryMarshal.GetReference(source), (nuint)i);
                Vector<float> f;
                if (unsigned)
                {
                    // BZERO = 2^31: flipping the sign bit gives the unsigned value exactly.
                    f = Vector.ConvertToSingle(Vector.AsVectorUInt32(v ^ sign));
                    if (s.HasBlank) f = Vector.ConditionalSelect(Vector.AsVectorSingle(Vector.Equals(v, blank)), nan, f);
                }
                else if (s.Mode == ScalingMode.Identity)
                {
                    f = Vector.ConvertToSingle(v);
                    if (s.HasBlank) f = Vector.ConditionalSelect(Vector.AsVectorSingle(Vector.Equals(v, blank)), nan, f);
                }
                else f = k.ApplyGeneral(v);
                f.CopyTo(destination.Slice(i));
            }
        }
        for (; i < n; i++)
        {
            var v = source[i];
            destination[i] = s.HasBlank && v == s.Blank ? float.NaN
                : unsigned ? (uint)(v ^ int.MinValue)
                : s.Mode == ScalingMode.Identity ? v
                : (float)(s.BZero + s.BScale * v);
        }
    }

    private static void DecodeInt64(Span<long> source, Span<float> destination, in SampleScaling s)
    {
        BinaryPrimitives.ReverseEndianness(source, source);
        var n = source.Length;
        var i = 0;
        if (s.Mode == ScalingMode.General && Vector.IsHardwareAccelerated)
        {
            var scale = new Vector<double>(s.BScale);
            var zero = new Vector<double>(s.BZero);
            var blank = new Vector<long>(s.Blank);
            var nan = new Vector<float>(float.NaN);
            for (; i <= n - 2 * Vector<long>.Count; i += 2 * Vector<long>.Count)
            {
                ref var r = ref MemoryMarshal.GetReference(source);
                var a = Vector.LoadUnsafe(ref r, (nuint)i);
                var b = Vector.LoadUnsafe(ref r, (nuint)(i + Vector<long>.Count));
                var f = Vector.Narrow(Vector.ConvertToDouble(a) * scale + zero, Vector.ConvertToDouble(b) * scale + zero);
                if (s.HasBlank)
                {
                    var mask = Vector.Narrow(Vector.AsVectorUInt64(Vector.Equals(a, blank)), Vector.AsVectorUInt64(Vector.Equals(b, blank)));
                    f = Vector.ConditionalSelect(Vector.AsVectorSingle(mask), nan, f);
                }
                f.CopyTo(destination.Slice(i));
            }
        }
        // Identity and integer offsets stay scalar: exact integer sums need 128 bits (64-bit images are rare).
        for (; i < n; i++)
        {
            var v = source[i];
            destination[i] = s.HasBlank && v == s.Blank ? float.NaN
                : s.Mode == ScalingMode.Identity ? v
                : s.Mode == ScalingMode.IntegerOffset ? ExactConversion.ToSingle(v + s.IntegerZero)
                : (float)(s.BZero + s.BScale * v);
        }
    }

    private static void DecodeFloat32(Span<float> source, Span<float> destination, in SampleScaling s)
    {
        var raw = MemoryMarshal.Cast<float, uint>(source);
        if (s.Mode == ScalingMode.Identity)
        {
            BinaryPrimitives.ReverseEndianness(raw, MemoryMarshal.Cast<float, uint>(destination[..raw.Length]));
            return;
        }
        BinaryPrimitives.ReverseEndianness(raw, raw);
        var n = source.Length;
        var i = 0;
        if (Vector.IsHardwareAccelerated)
        {
            var scale = new Vector<double>(s.BScale);
            var zero = new Vector<double>(s.BZero);
            for (; i <= n - Vector<float>.Count; i += Vector<float>.Count)
            {
                var v = Vector.LoadUnsafe(ref MemoryMarshal.GetReference(source), (nuint)i);
                Vector.Widen(v, out Vector<double> a, out Vector<double> b);
                Vector.Narrow(a * scale + zero, b * scale + zero).CopyTo(destination.Slice(i));
            }
        }
        for (; i < n; i++) destination[i] = (float)(s.BZero + s.BScale * source[i]);
    }

    private static void DecodeFloat64(Span<double> source, Span<float> destination, in SampleScaling s)
    {
        BinaryPrimitives.ReverseEndianness(MemoryMarshal.Cast<double, ulong>(source), MemoryMarshal.Cast<double, ulong>(source));
        var n = source.Length;
        var i = 0;
        var identity = s.Mode == ScalingMode.Identity;
        if (Vector.IsHardwareAccelerated)
        {
            var scale = new Vector<double>(s.BScale);
            var zero = new Vector<double>(s.BZero);
            ref var r = ref MemoryMarshal.GetReference(source);
            for (; i <= n - 2 * Vector<double>.Count; i += 2 * Vector<double>.Count)
            {
                var a = Vector.LoadUnsafe(ref r, (nuint)i);
                var b = Vector.LoadUnsafe(ref r, (nuint)(i + Vector<double>.Count));
                if (!identity)
                {
                    a = a * scale + zero;
                    b = b * scale + zero;
                }
                Vector.Narrow(a, b).CopyTo(destination.Slice(i));
            }
        }
        for (; i < n; i++) destination[i] = (float)(identity ? source[i] : s.BZero + s.BScale * source[i]);
    }

    /// <summary>8- and 16-bit samples: the integer sum is exact in int, the double product exact before one rounding.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static float ScalarSmall(int stored, in SampleScaling s)
    {
        if (s.HasBlank && stored == s.Blank) return float.NaN;
        return s.Mode switch
        {
            ScalingMode.Identity => stored,
            ScalingMode.IntegerOffset => (float)(stored + (double)s.IntegerZero),
            _ => (float)(s.BZero + s.BScale * stored),
        };
    }

    /// <summary>Lane-wise int32 samples (widened from 8 or 16 bits) to physical floats.</summary>
    private readonly struct IntKernel
    {
        private readonly Vector<int> _blank;
        private readonly Vector<double> _scale;
        private readonly Vector<double> _zero;
        private readonly Vector<float> _nan;
        private readonly Vector<int> _offset;
        private readonly bool _hasBlank;
        private readonly bool _offsetFitsInt;
        private readonly ScalingMode _mode;

        public IntKernel(in SampleScaling s)
        {
            _hasBlank = s.HasBlank;
            _blank = new Vector<int>(s.HasBlank ? (int)s.Blank : 0);
            _scale = new Vector<double>(s.BScale);
            _zero = new Vector<double>(s.BZero);
            _nan = new Vector<float>(float.NaN);
            _mode = s.Mode;
            // 8/16-bit samples plus an offset below 2^30 cannot overflow int.
            _offsetFitsInt = s.Mode == ScalingMode.IntegerOffset && Int128.Abs(s.IntegerZero) < (1 << 30);
            _offset = new Vector<int>(_offsetFitsInt ? (int)s.IntegerZero : 0);
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public Vector<float> Apply(Vector<int> stored)
        {
            Vector<float> f;
            if (_mode == ScalingMode.Identity) f = Vector.ConvertToSingle(stored);
            else if (_offsetFitsInt) f = Vector.ConvertToSingle(stored + _offset);
            else return ApplyGeneral(stored);
            return _hasBlank ? Vector.ConditionalSelect(Vector.AsVectorSingle(Vector.Equals(stored, _blank)), _nan, f) : f;
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public Vector<float> ApplyGeneral(Vector<int> stored)
        {
            Vector.Widen(stored, out Vector<long> a, out Vector<long> b);
            var f = Vector.Narrow(Vector.ConvertToDouble(a) * _scale + _zero, Vector.ConvertToDouble(b) * _scale + _zero);
            return _hasBlank ? Vector.ConditionalSelect(Vector.AsVectorSingle(Vector.Equals(stored, _blank)), _nan, f) : f;
        }
    }
}
