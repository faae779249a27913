namespace Mosaic.Server.Access;

/// <summary>What a presented share token turned out to be: valid for <see cref="Field"/> until <see cref="Expires"/>, or refused for <see cref="Failure"/>.</summary>
public sealed record ShareTokenCheck(string? Field, DateTimeOffset Expires, string? Failure)
{
    public bool IsValid => Failure is null;

    public static ShareTokenCheck Refused(string failure) => new(null, default, failure);
}
