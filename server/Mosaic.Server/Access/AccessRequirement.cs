using Microsoft.AspNetCore.Authorization;

namespace Mosaic.Server.Access;

/// <summary>The one rule every request meets: the caller may see the field it touches and do what it asks (see <see cref="AccessAuthorizationHandler"/>).</summary>
public sealed class AccessRequirement : IAuthorizationRequirement
{
    public const string Policy = "mosaic-access";
}
