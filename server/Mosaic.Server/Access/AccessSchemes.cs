namespace Mosaic.Server.Access;

public static class AccessSchemes
{
    /// <summary>The default scheme: a Bearer header, else the sign-in cookie, else the anonymous caller where allowed.</summary>
    public const string Token = "MosaicToken";

    /// <summary>The browser's sign-in cookie (ASP.NET Core's cookie handler).</summary>
    public const string Cookie = "MosaicCookie";

    public const string CookieName = "mosaic-access";

    /// <summary>Where the handler leaves why a presented credential was refused, for the 401 answer.</summary>
    internal const string FailureItem = "mosaic.access.failure";
}
