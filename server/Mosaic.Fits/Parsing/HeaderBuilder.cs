namespace Mosaic.Fits.Parsing;

/// <summary>Collects records into cards, joining CONTINUE pieces onto the string before them (FITS 4.0 section 4.2.1.2).</summary>
internal sealed class HeaderBuilder
{
    private readonly List<HeaderCard> _cards = [];
    private ParsedRecord? _open;          // a string ending in '&', waiting to see whether CONTINUE follows
    private System.Text.StringBuilder? _joined;
    private List<string>? _comments;

    public int Count => _cards.Count + (_open is null ? 0 : 1);

    public void Add(ParsedRecord record)
    {
        if (record.Kind == RecordKind.Continue && _open is not null)
        {
            _joined!.Append((string)record.Value!);
            if (!string.IsNullOrEmpty(record.Comment)) _comments!.Add(record.Comment);
            if (!record.Continues) Close(restoreAmpersand: false);
            return;
        }

        if (_open is not null) Close(restoreAmpersand: true);

        if (record.Kind == RecordKind.Continue)
        {
            // A CONTINUE not preceded by a string ending in '&' carries no value of its own: keep it as commentary.
            _cards.Add(new HeaderCard("CONTINUE", null, Describe(record)) { NoValueIndicator = true });
            return;
        }

        if (record.Continues)
        {
            _open = record;
            _joined = new System.Text.StringBuilder((string)record.Value!);
            _comments = string.IsNullOrEmpty(record.Comment) ? [] : [record.Comment];
            return;
        }

        _cards.Add(ToCard(record));
    }

    public Header Build()
    {
        if (_open is not null) Close(restoreAmpersand: true);
        return new Header(_cards);
    }

    private void Close(bool restoreAmpersand)
    {
        var open = _open!.Value;
        if (restoreAmpersand)
        {
            // The last '&' was not followed by CONTINUE, so it belongs to the string.
            _joined!.Append('&');
        }
        var comment = _comments!.Count == 0 ? open.Comment : string.Join(" ", _comments);
        _cards.Add(new HeaderCard(open.Keyword, _joined!.ToString(), comment));
        _open = null;
        _joined = null;
        _comments = null;
    }

    private static HeaderCard ToCard(ParsedRecord record) => record.Kind == RecordKind.Commentary
        ? new HeaderCard(record.Keyword, null, record.Comment) { NoValueIndicator = !IsStandardCommentary(record.Keyword) }
        : new HeaderCard(record.Keyword, record.Value, record.Comment);

    private static bool IsStandardCommentary(string keyword) => keyword is "COMMENT" or "HISTORY" or "";

    private static string Describe(ParsedRecord record)
    {
        var text = "'" + ((string)record.Value!).Replace("'", "''", StringComparison.Ordinal) + (record.Continues ? "&'" : "'");
        return record.Comment is null ? text : text + " / " + record.Comment;
    }
}
