namespace Mosaic.Browser.Tests.Hosting;

/// <summary>All browser tests share one server and one Chromium, and run one after another.</summary>
[CollectionDefinition(Name)]
public sealed class BrowserCollection : ICollectionFixture<MosaicSite>
{
    public const string Name = "browser";
}
