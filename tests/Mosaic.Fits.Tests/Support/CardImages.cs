using System.Text;
using Mosaic.Fits.Writing;

namespace Mosaic.Fits.Tests.Support;

/// <summary>The 80-character records FitsWriter produces, for checks on the card text itself.</summary>
public static class CardImages
{
    /// <summary>All header records of the first HDU written for these cards, END included.</summary>
    public static string[] OfEmptyPrimary(params HeaderCard[] cards)
    {
        using var stream = new MemoryStream();
        using (var writer = new FitsWriter(stream, leaveOpen: true)) writer.WriteEmptyPrimary(cards);
        var text = Encoding.ASCII.GetString(stream.ToArray());
        var records = Enumerable.Range(0, text.Length / 80).Select(i => text.Substring(i * 80, 80)).ToArray();
        var end = Array.FindIndex(records, r => r.StartsWith("END     ", StringComparison.Ordinal));
        return records[..(end + 1)];
    }

    /// <summary>The records after the writer's own mandatory cards (SIMPLE, BITPIX, NAXIS, EXTEND), END excluded.</summary>
    public static string[] UserRecords(params HeaderCard[] cards) => OfEmptyPrimary(cards)[4..^1];
}
