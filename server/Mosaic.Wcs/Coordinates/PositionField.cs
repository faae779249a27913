namespace Mosaic.Wcs.Coordinates;

/// <summary>One number read from typed text: its digits, whether a sign was written, and the mark after it.</summary>
internal readonly record struct PositionField(string Digits, bool Negative, bool Signed, FieldMark Mark, int Position)
{
    internal bool IsInteger => !Digits.Contains('.');

    /// <summary>0 for the leading field (hours or degrees), 1 for minutes, 2 for seconds; -1 when not a unit mark.</summary>
    internal int Level => Mark switch
    {
        FieldMark.Hours or FieldMark.Degrees => 0,
        FieldMark.Minutes => 1,
        FieldMark.Seconds => 2,
        _ => -1,
    };
}
