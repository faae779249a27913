using Mosaic.Demo.Scene;

namespace Mosaic.Demo.Tests.Support;

/// <summary>One Small-preset field, generated once for every test class of the collection, deleted afterwards.</summary>
public sealed class SmallField : IDisposable
{
    public SmallField()
    {
        Directory = Path.Combine(Path.GetTempPath(), $"mosaic-demo-small-{Guid.NewGuid():N}");
        Options = DemoFieldOptions.Small(Directory);
        Files = DemoFieldGenerator.Generate(Options);
        Scene = DemoScene.Build(Options);
    }

    public string Directory { get; }

    public DemoFieldOptions Options { get; }

    public DemoScene Scene { get; }

    public IReadOnlyList<string> Files { get; }

    public string FileOf(string band) => Path.Combine(Directory, band + ".fits");

    public void Dispose()
    {
        if (System.IO.Directory.Exists(Directory)) System.IO.Directory.Delete(Directory, recursive: true);
    }
}
