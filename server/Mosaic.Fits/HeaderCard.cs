namespace Mosaic.Fits;

/// <summary>One keyword record (FITS 4.0 section 4.1), with CONTINUE strings already joined.</summary>
/// <param name="Value">string, bool, long, System.Numerics.BigInteger (integers beyond 64 bits), double, System.Numerics.Complex, or null (undefined value / commentary card).</param>
public sealed record HeaderCard(string Keyword, object? Value, string? Comment)
{
    /// <summary>COMMENT, HISTORY, blank keyword, or any card without a value indicator.</summary>
    public bool IsCommentary => Value is null && Keyword is "COMMENT" or "HISTORY" or "";
}
