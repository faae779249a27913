namespace Mosaic.Imaging.Rendering;

/// <summary>Which loop a lookup table runs; Auto picks the fastest the processor has. The others exist so tests can compare paths.</summary>
internal enum LookupPath
{
    Auto,

    /// <summary>x86 AVX2: 8-lane float index, hardware gather of the levels.</summary>
    Gather,

    /// <summary>Vector&lt;float&gt; index at the machine's width, levels read one by one.</summary>
    Vector,

    /// <summary>One value at a time (also every path's tail).</summary>
    Scalar,
}
