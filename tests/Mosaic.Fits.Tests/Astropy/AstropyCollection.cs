namespace Mosaic.Fits.Tests.Astropy;

/// <summary>Shares one set of astropy-written files among the test classes that compare against them.</summary>
[CollectionDefinition(Name)]
public sealed class AstropyCollection : ICollectionFixture<AstropyReferenceFiles>
{
    public const string Name = "astropy reference files";
}
