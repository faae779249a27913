namespace Mosaic.Fits.Parsing;

/// <summary>Where a parse is happening, so every error names the file and the HDU.</summary>
internal readonly record struct ParseContext(string FilePath, int HduIndex)
{
    public FitsFormatException Error(string? keyword, string problem) => new(FilePath, HduIndex, keyword, problem);
}
