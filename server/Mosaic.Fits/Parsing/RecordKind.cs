namespace Mosaic.Fits.Parsing;

internal enum RecordKind
{
    /// <summary>A keyword with "= " in columns 9-10 (or a HIERARCH card).</summary>
    Value,

    /// <summary>COMMENT, HISTORY, blank keyword, or any keyword without a value indicator.</summary>
    Commentary,

    /// <summary>A CONTINUE card carrying a string piece (section 4.2.1.2).</summary>
    Continue,

    End,
}
