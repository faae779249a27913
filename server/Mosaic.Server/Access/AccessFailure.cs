using Microsoft.AspNetCore.Authorization;

namespace Mosaic.Server.Access;

/// <summary>Why <see cref="AccessAuthorizationHandler"/> refused, carried to <see cref="AccessResultHandler"/>.</summary>
public sealed class AccessFailure(IAuthorizationHandler handler, AccessRefusal refusal, string message, RequestField? field = null)
    : AuthorizationFailureReason(handler, message)
{
    public AccessRefusal Refusal { get; } = refusal;

    /// <summary>For <see cref="AccessRefusal.Hidden"/>: what was asked for, so the 404 reads as it would for a missing one.</summary>
    public RequestField? Field { get; } = field;
}
