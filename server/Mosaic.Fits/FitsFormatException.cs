namespace Mosaic.Fits;

/// <summary>A FITS file that breaks the standard in a way Mosaic cannot read past. Names the file, the HDU and the keyword.</summary>
public sealed class FitsFormatException : Exception
{
    public FitsFormatException(string filePath, int? hduIndex, string? keyword, string problem, Exception? inner = null)
        : base(Compose(filePath, hduIndex, keyword, problem), inner)
    {
        FilePath = filePath;
        HduIndex = hduIndex;
        Keyword = keyword;
        Problem = problem;
    }

    public string FilePath { get; }

    /// <summary>0 for the primary HDU; null when the problem is not inside one HDU.</summary>
    public int? HduIndex { get; }

    public string? Keyword { get; }

    /// <summary>The problem alone, without the file, HDU and keyword.</summary>
    public string Problem { get; }

    private static string Compose(string filePath, int? hduIndex, string? keyword, string problem)
    {
        var where = Path.GetFileName(filePath);
        if (hduIndex is int h) where += $", HDU {h}";
        if (keyword is not null) where += $", keyword {keyword}";
        return $"{where}: {problem}";
    }
}
