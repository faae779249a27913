namespace Mosaic.Fits;

/// <summary>One keyword record (FITS 4.0 section 4.1), with CONTINUE strings already joined.</summary>
/// <param name="Value">string, bool, long, System.Numerics.BigInteger (integers beyond 64 bits), double, System.Numerics.Complex, or null (undefined value / commentary card).</param>
/// <remarks>
/// HIERARCH cards are stored under the words after HIERARCH, single-spaced: "HIERARCH A  B C = 1" has Keyword "A B C".
/// Commentary text (COMMENT, HISTORY, blank keyword, no value indicator) is held in <see cref="Comment"/>.
/// </remarks>
public sealed record HeaderCard(string Keyword, object? Value, string? Comment)
{
    /// <summary>
    /// True for a card whose columns 9-10 are not "= " (section 4.1.2.2), so columns 9-80 are commentary text.
    /// Distinguishes "KEY     text" (commentary) from "KEY     =" with nothing after it (an undefined value).
    /// </summary>
    public bool NoValueIndicator { get; init; }

    /// <summary>COMMENT, HISTORY, blank keyword, or any card without a value indicator.</summary>
    public bool IsCommentary => Value is null && (NoValueIndicator || Keyword is "COMMENT" or "HISTORY" or "");
}
