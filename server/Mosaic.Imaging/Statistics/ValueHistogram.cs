using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Mosaic.Imaging.Statistics;

/// <summary>
/// A histogram over the whole float range, binned on the top <see cref="KeyBits"/> bits of the order-preserving
/// float32 bit pattern (relative bin width 2^-(KeyBits-9) = 2^-11), so one streaming pass needs no prior range.
/// Non-finite values (NaN, ±inf) count as masked. Mergeable across chips; saved with the pyramid.
/// Add and Merge are not thread-safe; once filled, the queries are.
/// </summary>
public sealed class ValueHistogram
{
    public const int KeyBits = 20;

    /// <summary>Values keyed per block: the keys stay in L1 between the vector pass and the counting pass.</summary>
    private const int ChunkLength = 2048;
    private const uint FileMagic = 0x5453_484D; // "MHST" read as a little-endian uint32
    private const int FileVersion = 1;

    private long[]? _counts;
    private CumulativeBins? _compact;
    private long _finite;
    private long _masked;
    private uint _minKey = uint.MaxValue;
    private uint _maxKey;
    private double _sum;
    private double _sumCompensation;

    public long FiniteCount => _finite;

    public long MaskedCount => _masked;

    public double Min => _finite == 0 ? double.NaN : FloatKey.ToFloat(_minKey);

    public double Max => _finite == 0 ? double.NaN : FloatKey.ToFloat(_maxKey);

    /// <summary>Sum of the finite values (double accumulation, Kahan-compensated across calls).</summary>
    public double Sum => _sum;

    public double Mean => _finite == 0 ? double.NaN : _sum / _finite;

    /// <summary>Relative width of a bin of normal floats: a quantile is exact to within one bin.</summary>
    public static double RelativeBinWidth { get; } = Math.ScaleB(1, -(KeyBits - 9));

    public void Add(ReadOnlySpan<float> values)
    {
        if (values.IsEmpty) return;
        var counts = DenseCounts();
        ref var countsRef = ref MemoryMarshal.GetArrayDataReference(counts);
        Span<uint> bins = stackalloc uint[ChunkLength];
        var bits = MemoryMarshal.Cast<float, uint>(values);

        var exponentMask = new Vector<uint>(0x7F80_0000u);
        var signBit = new Vector<uint>(0x8000_0000u);
        var minKeys = new Vector<uint>(uint.MaxValue);
        var maxKeys = Vector<uint>.Zero;
        var nonFiniteLanes = Vector<uint>.Zero;
        var sumLow = Vector<double>.Zero;
        var sumHigh = Vector<double>.Zero;
        uint minKey = uint.MaxValue, maxKey = 0;
        long nonFinite = 0;
        double scalarSum = 0;

        for (var start = 0; start < bits.Length; start += ChunkLength)
        {
            var chunk = bits.Slice(start, Math.Min(ChunkLength, bits.Length - start));
            var keys = bins[..chunk.Length];
            var i = 0;
            if (Vector.IsHardwareAccelerated)
            {
                for (; i <= chunk.Length - Vector<uint>.Count; i += Vector<uint>.Count)
                {
                    var b = new Vector<uint>(chunk[i..]);
                    var key = b ^ (Vector.AsVectorUInt32(Vector.ShiftRightArithmetic(Vector.AsVectorInt32(b), 31)) | signBit);
                    Vector.ShiftRightLogical(key, FloatKey.BinShift).CopyTo(keys[i..]);
                    // Exponent all ones: ±inf or NaN. Such lanes drop out of min/max/sum; their bins are never read.
                    var bad = Vector.Equals(b & exponentMask, exponentMask);
                    minKeys = Vector.Min(minKeys, key | bad);
                    maxKeys = Vector.Max(maxKeys, Vector.AndNot(key, bad));
                    nonFiniteLanes -= bad;
                    Vector.Widen(Vector.AsVectorSingle(Vector.AndNot(b, bad)), out var low, out var high);
                    sumLow += low;
                    sumHigh += high;
                }
            }
            for (; i < chunk.Length; i++)
            {
                var b = chunk[i];
                var key = FloatKey.FromBits(b);
                keys[i] = key >> FloatKey.BinShift;
                if ((b & 0x7F80_0000u) == 0x7F80_0000u) { nonFinite++; continue; }
                if (key < minKey) minKey = key;
                if (key > maxKey) maxKey = key;
                scalarSum += BitConverter.UInt32BitsToSingle(b);
            }
            // Branch-free counting: non-finite values land in bins outside [FirstFiniteBin, LastFiniteBin].
            foreach (var k in keys) Unsafe.Add(ref countsRef, (nint)k)++;
        }

        for (var lane = 0; lane < Vector<uint>.Count; lane++)
        {
            minKey = Math.Min(minKey, minKeys[lane]);
            maxKey = Math.Max(maxKey, maxKeys[lane]);
            nonFinite += nonFiniteLanes[lane];
        }
        var finite = values.Length - nonFinite;
        _masked += nonFinite;
        _finite += finite;
        if (finite == 0) return;
        _minKey = Math.Min(_minKey, minKey);
        _maxKey = Math.Max(_maxKey, maxKey);
        AddToSum(Vector.Sum(sumLow) + Vector.Sum(sumHigh) + scalarSum);
    }

    public void Merge(ValueHistogram other)
    {
        ArgumentNullException.ThrowIfNull(other);
        var otherCompact = other._counts is null ? other.Compact() : null;
        var counts = DenseCounts();
        if (otherCompact is null)
        {
            var source = other._counts!;
            for (var b = other.FirstBin; b <= other.LastBin; b++) counts[b] += source[b];
        }
        else
        {
            for (var i = 0; i < otherCompact.Bins.Length; i++) counts[otherCompact.Bins[i]] += otherCompact.CountAt(i);
        }
        var (finite, masked, sum) = (other._finite, other._masked, other._sum);
        _finite += finite;
        _masked += masked;
        if (finite == 0) return;
        _minKey = Math.Min(_minKey, other._minKey);
        _maxKey = Math.Max(_maxKey, other._maxKey);
        AddToSum(sum);
    }

    /// <summary>
    /// The value below which a share p (0..1) of the finite pixels lie: the rank p·(n-1) of the sorted values (the
    /// usual linear definition), found by its bin and interpolated in value inside the bin as if the bin's pixels
    /// were spread evenly over it; clamped to [Min, Max]. NaN when no pixel is finite.
    /// </summary>
    public double Quantile(double p)
    {
        if (!(p >= 0 && p <= 1)) throw new ArgumentOutOfRangeException(nameof(p), p, "a quantile needs a share between 0 and 1");
        if (_finite == 0) return double.NaN;
        if (p == 0) return Min;
        if (p == 1) return Max;
        var compact = Compact();
        var rank = p * (_finite - 1);
        var index = compact.IndexOfRank((long)Math.Floor(rank));
        var (low, high) = ClampedRange(compact.Bins[index]);
        var position = (rank - compact.Before(index) + 0.5) / compact.CountAt(index);
        return Math.Clamp(low + Math.Clamp(position, 0, 1) * (high - low), Min, Max);
    }

    /// <summary>Share of finite pixels with value ≤ v, interpolated inside v's bin (the inverse of <see cref="Quantile"/>). NaN when no pixel is finite.</summary>
    public double CumulativeFraction(double v)
    {
        if (double.IsNaN(v)) throw new ArgumentOutOfRangeException(nameof(v), v, "NaN has no place in the order of values");
        if (_finite == 0) return double.NaN;
        if (v < Min) return 0;
        if (v >= Max) return 1;
        var compact = Compact();
        var bin = FloatKey.FromFloat((float)v) >> FloatKey.BinShift;
        var index = compact.IndexOfBin(bin);
        if (index < 0) return (double)compact.Before(~index) / _finite;
        var (low, high) = ClampedRange(bin);
        var inside = high > low ? Math.Clamp((v - low) / (high - low), 0, 1) : 1;
        return (compact.Before(index) + inside * compact.CountAt(index)) / _finite;
    }

    /// <summary>Writes the counts sparsely (non-empty finite bins only), little-endian.</summary>
    public void Save(Stream stream)
    {
        ArgumentNullException.ThrowIfNull(stream);
        var compact = Compact();
        using var writer = new BinaryWriter(stream, System.Text.Encoding.UTF8, leaveOpen: true);
        writer.Write(FileMagic);
        writer.Write(FileVersion);
        writer.Write(KeyBits);
        writer.Write(_finite);
        writer.Write(_masked);
        writer.Write(_minKey);
        writer.Write(_maxKey);
        writer.Write(_sum);
        writer.Write(compact.Bins.Length);
        for (var i = 0; i < compact.Bins.Length; i++)
        {
            writer.Write(compact.Bins[i]);
            writer.Write(compact.CountAt(i));
        }
    }

    /// <summary>Reads what <see cref="Save"/> wrote, into the compact form; InvalidDataException for anything else.</summary>
    public static ValueHistogram Load(Stream stream)
    {
        ArgumentNullException.ThrowIfNull(stream);
        try
        {
            using var reader = new BinaryReader(stream, System.Text.Encoding.UTF8, leaveOpen: true);
            if (reader.ReadUInt32() != FileMagic) throw new InvalidDataException("not a value histogram (bad magic number)");
            var version = reader.ReadInt32();
            if (version != FileVersion) throw new InvalidDataException($"value histogram format version {version}, expected {FileVersion}");
            var keyBits = reader.ReadInt32();
            if (keyBits != KeyBits) throw new InvalidDataException($"value histogram with {keyBits}-bit keys, expected {KeyBits}");
            var h = new ValueHistogram
            {
                _finite = reader.ReadInt64(),
                _masked = reader.ReadInt64(),
                _minKey = reader.ReadUInt32(),
                _maxKey = reader.ReadUInt32(),
                _sum = reader.ReadDouble(),
            };
            var binCount = reader.ReadInt32();
            if (h._finite < 0 || h._masked < 0 || binCount < 0 || binCount > FloatKey.BinCount)
                throw new InvalidDataException("value histogram with negative or impossible counts");
            var bins = new uint[binCount];
            var cumulative = new long[binCount];
            long running = 0;
            for (var i = 0; i < binCount; i++)
            {
                var bin = reader.ReadUInt32();
                var count = reader.ReadInt64();
                if (!FloatKey.IsFiniteBin(bin) || (i > 0 && bin <= bins[i - 1]) || count <= 0)
                    throw new InvalidDataException($"value histogram bin {i} is out of order, non-finite or empty");
                bins[i] = bin;
                running += count;
                cumulative[i] = running;
            }
            if (running != h._finite) throw new InvalidDataException($"value histogram bins hold {running} pixels, header says {h._finite}");
            if (binCount > 0 && (h._minKey >> FloatKey.BinShift != bins[0] || h._maxKey >> FloatKey.BinShift != bins[^1]))
                throw new InvalidDataException("value histogram minimum or maximum lies outside its bins");
            h._compact = new CumulativeBins(bins, cumulative);
            return h;
        }
        catch (EndOfStreamException e)
        {
            throw new InvalidDataException("value histogram is truncated", e);
        }
    }

    /// <summary>Finite values all lie in the bins of Min to Max: scanning only those leaves the untouched pages of the dense counts alone. Empty when no value is finite.</summary>
    private int FirstBin => (int)(_minKey >> FloatKey.BinShift);

    private int LastBin => _finite == 0 ? -1 : (int)(_maxKey >> FloatKey.BinShift);

    private (double Low, double High) ClampedRange(uint bin)
    {
        var (low, high) = FloatKey.BinRange(bin);
        return (Math.Max(low, Min), Math.Min(high, Max));
    }

    private long[] DenseCounts()
    {
        if (_counts is { } counts)
        {
            _compact = null;
            return counts;
        }
        counts = new long[FloatKey.BinCount];
        if (_compact is { } compact)
            for (var i = 0; i < compact.Bins.Length; i++) counts[compact.Bins[i]] = compact.CountAt(i);
        _compact = null;
        _counts = counts;
        return counts;
    }

    private CumulativeBins Compact()
    {
        var compact = Volatile.Read(ref _compact);
        if (compact is not null) return compact;
        compact = _counts is null || _finite == 0 ? new CumulativeBins([], []) : CumulativeBins.FromDense(_counts, FirstBin, LastBin);
        Volatile.Write(ref _compact, compact);
        return compact;
    }

    private void AddToSum(double value)
    {
        var y = value - _sumCompensation;
        var t = _sum + y;
        _sumCompensation = t - _sum - y;
        _sum = t;
    }
}
