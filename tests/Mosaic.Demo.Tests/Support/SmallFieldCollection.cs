namespace Mosaic.Demo.Tests.Support;

[CollectionDefinition(Name)]
public sealed class SmallFieldCollection : ICollectionFixture<SmallField>
{
    public const string Name = "small demo field";
}
