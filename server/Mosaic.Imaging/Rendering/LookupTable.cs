using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using Mosaic.Imaging.Display.Limits;

namespace Mosaic.Imaging.Rendering;

/// <summary>
/// Levels at u_i = i / (entries - 1), read at the nearest entry. Where neighbours differ by at most one level and
/// the curve is monotone between them, the exact level of any u lies between the two entries around it, so the
/// nearest entry is within 1 DN. One extra entry past the end holds 0 for NaN.
/// </summary>
/// <remarks>The float32 index stays well within an entry of the exact u up to 2^20 entries.</remarks>
internal sealed class LookupTable
{
    private readonly byte[] _levels;
    // lo split in two floats so (v - hi part) - low part keeps lo's double precision in float arithmetic.
    private readonly float _loHigh;
    private readonly float _loLow;
    private readonly float _scale;
    private readonly float _lastIndex;

    private LookupTable(ValueRange limits, byte[] levels, int entries, int largestStep)
    {
        _levels = levels;
        Entries = entries;
        LargestStep = largestStep;
        _loHigh = (float)limits.Lo;
        _loLow = (float)(limits.Lo - _loHigh);
        _scale = (float)((entries - 1) / limits.Width);
        _lastIndex = entries - 1;
        if (!float.IsFinite(_scale) || !(_scale > 0))
            throw new ArgumentOutOfRangeException(nameof(limits), limits, "hi - lo is too small for a float32 table index");
    }

    public int Entries { get; }

    public long RetainedBytes => _levels.Length;

    public byte this[int index] => _levels[index];

    public static LookupTable Build(ValueRange limits, LevelFunction levelOf, int entries)
    {
        // + 1 for the NaN entry, + 3 so a 4-byte gather at the last index stays inside the array.
        var levels = new byte[entries + 4];
        var largestStep = FillMonotone(levels.AsSpan(0, entries), levelOf);
        return new LookupTable(limits, levels, entries, largestStep);
    }

    // The level function is monotone in u (LevelFunction), so once an entry has a level, every entry up to the first
    // one with another level has it too: the table is a run of equal levels per step, and filling it means finding
    // where each run ends. The end is first guessed one run length on (neighbouring runs of a smooth curve are about
    // as long), then bracketed by doubling steps from the guess and split in halves. A good guess costs 2
    // evaluations a run, against about 2 log2(run length) when halving the whole table, and the compile of a new
    // display is mostly these evaluations. Returns the largest step between neighbouring entries.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int FillMonotone(Span<byte> levels, LevelFunction levelOf)
    {
        var last = levels.Length - 1;
        double scale = last;
        var level = levelOf.At(0);
        if (last == 0)
        {
            levels[0] = level;
            return 0;
        }
        var lastLevel = levelOf.At(1);
        var largestStep = 0;
        var start = 0;
        var runLength = 1;
        while (true)
        {
            // Monotone: the run reaches the end when the last entry has its level.
            if (level == lastLevel)
            {
                levels[start..].Fill(level);
                return largestStep;
            }
            // Find the first entry after start whose level differs: after lo (same level), at or before hi (not).
            int lo, hi;
            byte hiLevel;
            var guess = Math.Min(last, start + runLength);
            var guessLevel = LevelAt(guess);
            if (guessLevel == level)
            {
                lo = guess;
                for (var step = 1; ; step *= 2)
                {
                    var probe = (int)Math.Min(last, (long)lo + step);
                    var probeLevel = LevelAt(probe);
                    if (probeLevel != level)
                    {
                        hi = probe;
                        hiLevel = probeLevel;
                        break;
                    }
                    lo = probe;
                }
            }
            else
            {
                hi = guess;
                hiLevel = guessLevel;
                lo = start;
                for (var step = 1; hi - step > start; step *= 2)
                {
                    var probe = hi - step;
                    var probeLevel = levelOf.At(probe / scale);
                    if (probeLevel == level)
                    {
                        lo = probe;
                        break;
                    }
                    hi = probe;
                    hiLevel = probeLevel;
                }
            }
            while (hi - lo > 1)
            {
                var mid = lo + (hi - lo) / 2;
                var midLevel = levelOf.At(mid / scale);
                if (midLevel == level) lo = mid;
                else
                {
                    hi = mid;
                    hiLevel = midLevel;
                }
            }
            levels[start..hi].Fill(level);
            largestStep = Math.Max(largestStep, Math.Abs(hiLevel - level));
            runLength = hi - start;
            start = hi;
            level = hiLevel;
        }

        byte LevelAt(int index) => index == last ? lastLevel : levelOf.At(index / scale);
    }

    /// <summary>The largest difference in level between neighbouring entries.</summary>
    public int LargestStep { get; }

    public int Apply(ReadOnlySpan<float> values, Span<byte> levels) => Apply(values, levels, LookupPath.Auto);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public int Apply(ReadOnlySpan<float> values, Span<byte> levels, LookupPath path)
    {
        if (levels.Length < values.Length) throw new ArgumentException("levels must be at least as long as values", nameof(levels));
        ref var source = ref MemoryMarshal.GetReference(values);
        ref var target = ref MemoryMarshal.GetReference(levels);
        ref var table = ref MemoryMarshal.GetArrayDataReference(_levels);
        var n = values.Length;
        var i = 0;
        var masked = 0;
        if (path == LookupPath.Auto) path = Avx2.IsSupported ? LookupPath.Gather : Vector.IsHardwareAccelerated ? LookupPath.Vector : LookupPath.Scalar;
        if (path == LookupPath.Gather)
        {
            if (!Avx2.IsSupported) throw new PlatformNotSupportedException("the gather path needs AVX2");
            masked += ApplyGather(ref source, ref target, n, ref i);
        }
        else if (path == LookupPath.Vector) masked += ApplyVector(ref source, ref target, ref table, n, ref i);
        for (; i < n; i++)
        {
            var v = Unsafe.Add(ref source, i);
            int index;
            if (float.IsNaN(v)) { index = Entries; masked++; }
            else index = IndexOf(v);
            Unsafe.Add(ref target, i) = Unsafe.Add(ref table, index);
        }
        return masked;
    }

    // The same float operations, in the same order, as the vector paths, so every path gives the same level.
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private int IndexOf(float v)
    {
        var f = (v - _loHigh - _loLow) * _scale + 0.5f;
        if (!(f > 0)) f = 0;
        if (f > _lastIndex) f = _lastIndex;
        return (int)f;
    }

    // Gathers win over scalar reads by about 2x here (ToneMapBenchmarks); 256-bit index arithmetic measured as fast
    // as 512-bit since the gathers dominate, so one path serves AVX2 and AVX-512 machines alike.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private unsafe int ApplyGather(ref float source, ref byte target, int n, ref int start)
    {
        var loHigh = Vector256.Create(_loHigh);
        var loLow = Vector256.Create(_loLow);
        var scale = Vector256.Create(_scale);
        var half = Vector256.Create(0.5f);
        var lastIndex = Vector256.Create(_lastIndex);
        var sentinel = Vector256.Create(Entries);
        var lowByte = Vector256.Create(0xFF);
        var masked = 0;
        var i = start;
        fixed (byte* table = _levels)
        {
            for (; i <= n - 16; i += 16)
            {
                var v0 = Vector256.LoadUnsafe(ref source, (nuint)i);
                var v1 = Vector256.LoadUnsafe(ref source, (nuint)(i + 8));
                var nan0 = ~Vector256.Equals(v0, v0).AsInt32();
                var nan1 = ~Vector256.Equals(v1, v1).AsInt32();
                masked += BitOperations.PopCount(nan0.ExtractMostSignificantBits() | (nan1.ExtractMostSignificantBits() << 8));
                var k0 = Vector256.ConditionalSelect(nan0, sentinel, Vector256.ConvertToInt32Native(Clamp(v0)));
                var k1 = Vector256.ConditionalSelect(nan1, sentinel, Vector256.ConvertToInt32Native(Clamp(v1)));
                // 4-byte reads at byte offsets (the table is padded past its end); only the low byte is the level.
                var g0 = Avx2.GatherVector256((int*)table, k0, 1) & lowByte;
                var g1 = Avx2.GatherVector256((int*)table, k1, 1) & lowByte;
                var words = Vector256.Narrow(g0, g1).AsUInt16();
                Vector128.Narrow(words.GetLower(), words.GetUpper()).StoreUnsafe(ref target, (nuint)i);
            }
        }
        start = i;
        return masked;

        Vector256<float> Clamp(Vector256<float> v)
            => Vector256.MinNative(Vector256.MaxNative((v - loHigh - loLow) * scale + half, Vector256<float>.Zero), lastIndex);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private int ApplyVector(ref float source, ref byte target, ref byte table, int n, ref int start)
    {
        var loHigh = new Vector<float>(_loHigh);
        var loLow = new Vector<float>(_loLow);
        var scale = new Vector<float>(_scale);
        var half = new Vector<float>(0.5f);
        var lastIndex = new Vector<float>(_lastIndex);
        var sentinel = new Vector<int>(Entries);
        Span<int> indices = stackalloc int[Vector<int>.Count];
        ref var index = ref MemoryMarshal.GetReference(indices);
        var masked = 0;
        var i = start;
        for (; i <= n - Vector<float>.Count; i += Vector<float>.Count)
        {
            var v = Vector.LoadUnsafe(ref source, (nuint)i);
            var f = (v - loHigh - loLow) * scale + half;
            f = Vector.MinNative(Vector.MaxNative(f, Vector<float>.Zero), lastIndex);
            var nan = ~Vector.Equals(v, v);
            Vector.ConditionalSelect(nan, sentinel, Vector.ConvertToInt32Native(f)).StoreUnsafe(ref index);
            // Each NaN lane of the mask is -1.
            masked -= Vector.Sum(nan);
            ref var row = ref Unsafe.Add(ref target, i);
            for (var k = 0; k < Vector<int>.Count; k++) Unsafe.Add(ref row, k) = Unsafe.Add(ref table, Unsafe.Add(ref index, k));
        }
        start = i;
        return masked;
    }
}
