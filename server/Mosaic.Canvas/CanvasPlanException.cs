namespace Mosaic.Canvas;

/// <summary>The chips of a field admit no common canvas (a chip with no sky position, too far from the others, or a canvas too large).</summary>
public sealed class CanvasPlanException : Exception
{
    public CanvasPlanException(string message) : base(message) { }

    public CanvasPlanException(string message, Exception inner) : base(message, inner) { }
}
