namespace Mosaic.Fits.Tests.Compressed;

/// <summary>Shares one set of fpack files between the test classes that read them.</summary>
[CollectionDefinition(Name)]
public sealed class FpackCollection : ICollectionFixture<FpackReferenceFiles>
{
    public const string Name = "fpack reference files";
}
