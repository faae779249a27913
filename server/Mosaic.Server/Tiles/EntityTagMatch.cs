using Microsoft.Extensions.Primitives;
using Microsoft.Net.Http.Headers;

namespace Mosaic.Server.Tiles;

public static class EntityTagMatch
{
    /// <summary>
    /// True when If-None-Match says the client already holds <paramref name="etag"/>: the field is "*" or lists a tag
    /// equal to it by weak comparison, so W/"x" matches "x" (RFC 9110 sections 13.1.2 and 8.8.3.2). A field that does
    /// not parse is ignored, which only costs a full answer.
    /// </summary>
    public static bool ClientHolds(StringValues ifNoneMatch, string etag)
    {
        if (StringValues.IsNullOrEmpty(ifNoneMatch)) return false;
        if (!EntityTagHeaderValue.TryParseList(ifNoneMatch, out var tags)) return false;
        var current = EntityTagHeaderValue.Parse(etag);
        foreach (var tag in tags)
            if (tag.Equals(EntityTagHeaderValue.Any) || tag.Compare(current, useStrongComparison: false)) return true;
        return false;
    }
}
