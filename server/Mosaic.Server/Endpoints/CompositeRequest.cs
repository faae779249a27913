using Mosaic.Imaging.Composite;

namespace Mosaic.Server.Endpoints;

/// <summary>A parsed composite query: the band named for each channel and the composite settings.</summary>
public sealed record CompositeRequest(Channels<string> Bands, ICompositeSettings Settings);
