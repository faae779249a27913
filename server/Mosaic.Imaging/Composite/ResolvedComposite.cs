using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Composite;

/// <summary>
/// A composite resolved against its three bands, as a client shows it: the Lupton parameters (mode lupton) or each
/// channel's resolved display (mode each), the channel weights and the masked colour.
/// </summary>
public sealed class ResolvedComposite
{
    public ResolvedComposite(string mode, string canonicalKey, MaskedColor masked, Channels<double> scale,
        LuptonParameters? lupton, Channels<ResolvedDisplay>? displays)
    {
        ArgumentNullException.ThrowIfNull(mode);
        ArgumentNullException.ThrowIfNull(canonicalKey);
        if ((lupton is null) == (displays is null))
            throw new ArgumentException("a resolved composite has either Lupton parameters or per-channel displays", nameof(lupton));
        Mode = mode;
        CanonicalKey = canonicalKey;
        Masked = masked;
        Scale = scale;
        Lupton = lupton;
        Displays = displays;
    }

    public string Mode { get; }

    public string CanonicalKey { get; }

    public MaskedColor Masked { get; }

    public Channels<double> Scale { get; }

    /// <summary>Mode lupton: Q, range and minima as resolved; null otherwise.</summary>
    public LuptonParameters? Lupton { get; }

    /// <summary>Mode each: every channel's limits, stretch and gray colour bar (before its weight); null otherwise.</summary>
    public Channels<ResolvedDisplay>? Displays { get; }
}
