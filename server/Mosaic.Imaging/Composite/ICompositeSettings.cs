using Mosaic.Imaging.Display;

namespace Mosaic.Imaging.Composite;

/// <summary>How three bands become one colour image. Equal settings compare equal and share a canonical key.</summary>
public interface ICompositeSettings
{
    /// <summary>"lupton" or "each", as the rgb query parameter spells it.</summary>
    string Mode { get; }

    /// <summary>Stable text, the same for equal settings: part of tile cache keys and ETags. No '/', quote or space.</summary>
    string CanonicalKey { get; }

    /// <summary>How pixels masked in any of the three bands are drawn.</summary>
    MaskedColor Masked { get; }

    /// <summary>Defaults and limits resolved against each channel's band, compiled for the tile loop.</summary>
    CompositeMap Compile(Channels<ChannelBand> bands);

    /// <summary>The same resolution, described for a client (no tile tables built).</summary>
    ResolvedComposite Resolve(Channels<ChannelBand> bands);
}
