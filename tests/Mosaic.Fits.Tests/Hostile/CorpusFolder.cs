using System.Text.Json;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Hostile;

/// <summary>Writes <see cref="HostileCorpus"/> to a temporary folder and asks astropy (Debian python3-astropy) about every file once.</summary>
public sealed class CorpusFolder : IDisposable
{
    private readonly TempFolder _folder = new();
    private readonly Dictionary<string, string?> _astropy;

    public CorpusFolder()
    {
        foreach (var (name, make) in HostileCorpus.Files) File.WriteAllBytes(_folder.File(name), make());
        var output = Support.Astropy.Run("verdicts.py", [.. HostileCorpus.Files.Keys.Select(_folder.File)]);
        _astropy = JsonSerializer.Deserialize<Dictionary<string, string?>>(output)
            ?? throw new InvalidOperationException("verdicts.py printed no JSON");
    }

    public string PathOf(string name) => HostileCorpus.Files.ContainsKey(name)
        ? _folder.File(name)
        : throw new ArgumentException($"{name} is not in the corpus");

    /// <summary>Astropy's message refusing the file, or null where astropy read it.</summary>
    public string? AstropyRefusal(string name) => _astropy[name];

    public void Dispose() => _folder.Dispose();
}
