namespace Mosaic.Imaging.Display.Stretches;

/// <summary>Where the asinh pivot comes from.</summary>
public enum AsinhPivotKind
{
    /// <summary>The lower limit.</summary>
    Lo,

    /// <summary>The band's field-wide median.</summary>
    Median,

    /// <summary>A fixed physical value.</summary>
    Value,
}
