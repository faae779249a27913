namespace Mosaic.Fits;

/// <summary>The parsed header of one HDU: cards in file order, with keyword look-ups (last occurrence wins for duplicates of non-commentary keywords).</summary>
public sealed class Header
{
    private readonly Dictionary<string, HeaderCard> _byKeyword = new(StringComparer.Ordinal);

    public Header(IReadOnlyList<HeaderCard> cards)
    {
        Cards = cards;
        foreach (var card in cards)
            if (!card.IsCommentary) _byKeyword[card.Keyword] = card;
    }

    public IReadOnlyList<HeaderCard> Cards { get; }

    public bool Contains(string keyword) => _byKeyword.ContainsKey(keyword);

    public HeaderCard? Find(string keyword) => _byKeyword.GetValueOrDefault(keyword);

    public string? GetString(string keyword) => Find(keyword)?.Value as string;

    public bool? GetBool(string keyword) => Find(keyword)?.Value as bool?;

    /// <summary>An integer value, or null where absent or not an integer that fits 64 bits.</summary>
    public long? GetLong(string keyword) => Find(keyword)?.Value switch
    {
        long l => l,
        _ => null,
    };

    /// <summary>A real or integer value as double, or null where absent or not numeric.</summary>
    public double? GetDouble(string keyword) => Find(keyword)?.Value switch
    {
        double d => d,
        long l => l,
        System.Numerics.BigInteger b => (double)b,
        _ => null,
    };
}
