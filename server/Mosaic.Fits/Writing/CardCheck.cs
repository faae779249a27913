using System.Text;

namespace Mosaic.Fits.Writing;

/// <summary>Whether a card read from one file can be written again by <see cref="FitsWriter"/>, which formats values its own way.</summary>
public static class CardCheck
{
    /// <summary>
    /// The card as the writer will take it: unchanged, or with its comment shortened where the rewritten value
    /// leaves less room than the original had; null for a card the writer cannot express (HIERARCH or a keyword of
    /// characters outside FITS 4.0 section 4.1.2.1, a keyword the writer puts itself, a value it has no form for).
    /// </summary>
    public static HeaderCard? Writable(HeaderCard card)
    {
        ArgumentNullException.ThrowIfNull(card);
        if (KeywordRules.IsWriterOwned(card.Keyword)) return null;
        if (Fits(card)) return card;
        if (card.Comment is not { Length: > 0 } comment || card.IsCommentary) return null;
        // Trim the comment until the card fits; dropping it entirely is the last resort.
        for (var length = Math.Min(comment.Length - 1, CardFormatter.CardLength); length >= 0; length--)
        {
            var shorter = card with { Comment = length == 0 ? null : comment[..length].TrimEnd() };
            if (Fits(shorter)) return shorter;
        }
        return null;
    }

    private static bool Fits(HeaderCard card)
    {
        try
        {
            CardFormatter.Append(new StringBuilder(CardFormatter.CardLength), card);
            return true;
        }
        catch (ArgumentException)
        {
            return false;
        }
    }
}
