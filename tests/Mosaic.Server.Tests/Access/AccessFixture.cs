using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Server.Tests.Access;

/// <summary>
/// Three small single-file fields: "open" (public), "hidden" (private by its marker file) and "listed" (private when
/// --private-fields names it); an access-token file; and a state folder per server.
/// </summary>
public sealed class AccessFixture : IDisposable
{
    public const string Token = "k3v7-access-token-for-tests-0001";

    public const string SecondToken = "k3v7-access-token-for-tests-0002";

    public AccessFixture()
    {
        Root = Path.Combine(Path.GetTempPath(), $"mosaic-access-tests-{Guid.NewGuid():N}");
        DataDirectory = Path.Combine(Root, "data");
        CacheDirectory = Path.Combine(Root, "cache");
        Directory.CreateDirectory(DataDirectory);
        foreach (var name in new[] { "open", "hidden", "listed" }) WriteField(name);
        File.WriteAllText(Path.Combine(DataDirectory, "hidden.fits.mosaic-private"), "");
        TokenFile = Path.Combine(Root, "tokens.txt");
        File.WriteAllText(TokenFile, $"# tokens for the access tests\n{Token}\n\n  {SecondToken}  \n");
        StateDirectory = Path.Combine(Root, "state");
    }

    public string Root { get; }

    public string DataDirectory { get; }

    public string CacheDirectory { get; }

    public string StateDirectory { get; }

    public string TokenFile { get; }

    /// <summary>The command-line settings of a server that needs a token; <paramref name="more"/> adds or overrides.</summary>
    public Dictionary<string, string> TokenSettings(params (string Key, string Value)[] more)
    {
        var settings = new Dictionary<string, string> { ["access-token-file"] = TokenFile, ["private-fields"] = "listed" };
        foreach (var (key, value) in more) settings[key] = value;
        return settings;
    }

    private void WriteField(string name)
    {
        using var stream = File.Create(Path.Combine(DataDirectory, name + ".fits"));
        using var writer = new FitsWriter(stream);
        var pixels = new float[32 * 24];
        for (var i = 0; i < pixels.Length; i++) pixels[i] = i % 97;
        writer.WriteFloatImage([new HeaderCard("BUNIT", "adu", null)], 32, 24, pixels);
    }

    public void Dispose()
    {
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
    }
}
