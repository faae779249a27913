using Mosaic.Server.Hosting;

namespace Mosaic.Server.Tests.Hosting;

/// <summary>
/// The server's command line: the host's configuration would take any --name value, so a misspelt option must
/// stop the server with a line naming it rather than be ignored (common practice for command-line programs).
/// </summary>
public sealed class ServerArgumentsTests : IDisposable
{
    private static readonly TimeSpan StartLimit = TimeSpan.FromSeconds(60);
    private readonly string _work = Directory.CreateTempSubdirectory("mosaic-arguments-").FullName;

    [Theory]
    [InlineData("--data", "/srv/fits", "--cache", "/var/cache/mosaic")]
    [InlineData("--data=/srv/fits", "--tile-memory-mb", "64")]
    [InlineData("--urls", "http://0.0.0.0:5000", "--anonymous", "public")]
    [InlineData("--Logging:LogLevel:Default", "Warning")]
    [InlineData("--environment=Development", "--contentRoot=/tmp")]
    [InlineData("--TILE-MEMORY-MB", "64")]
    public void OurOptionsHostKeysAndConfigurationPathsPass(params string[] args)
        => Assert.Null(ServerArguments.Problem(args));

    [Fact]
    public void TheOptionsAreTheOnesTheReadmeDocuments()
    {
        // The README is where users look the options up: every option accepted is named there as `--name`, and
        // every `--name` its "Serving your own data" and "Access" sections name is accepted.
        var readme = File.ReadAllText(Path.Combine(RepositoryRoot(), "README.md"));
        var serving = readme[readme.IndexOf("## Serving your own data", StringComparison.Ordinal)..readme.IndexOf("## Whole camera fields", StringComparison.Ordinal)];
        static HashSet<string> Named(string text) => System.Text.RegularExpressions.Regex.Matches(text, @"`--([a-z][a-z-]*)").Select(m => m.Groups[1].Value).ToHashSet();
        Assert.Empty(ServerArguments.Options.Except(Named(readme)));
        Assert.Empty(Named(serving).Except(ServerArguments.Options));
    }

    [Theory]
    [InlineData("unknown option '--port' (did you mean --urls?)", "--port", "8080")]
    [InlineData("unknown option '--tile-mem' (did you mean --tile-memory-mb or --tile-disk-mb?)", "--tile-mem", "40")]
    [InlineData("unknown option '--dat=/srv'", "--dat=/srv")]
    [InlineData("'/srv/fits' is not an option", "/srv/fits")]
    [InlineData("'stray' is not an option", "--data", "/srv", "stray")]
    [InlineData("option '--data' needs a value", "--data")]
    [InlineData("option '--cache' needs a value", "--cache", "--data", "/srv")]
    public void AMisspeltOrIncompleteCommandLineIsNamed(string expected, params string[] args)
        => Assert.StartsWith(expected, ServerArguments.Problem(args));

    [Fact]
    public void NothingAfterABareDoubleDashIsChecked()
        => Assert.Null(ServerArguments.Problem(["--data", "/srv", "--", "--anything"]));

    [Theory]
    [InlineData(new[] { "--port", "8080" }, "mosaic: unknown option '--port' (did you mean --urls?)")]
    [InlineData(new[] { "--cutout-limit", "many" }, "mosaic: --cutout-limit must be a whole number of pixels, at least 1; got 'many'.")]
    [InlineData(new[] { "--anonymous", "nobody" }, "mosaic: --anonymous must be 'none' or 'public'; got 'nobody'.")]
    public void TheServerStopsWithOneLineAndTheUsageExitCode(string[] more, string expected)
    {
        using var server = RealServer.Start(
            ["--data", Path.Combine(_work, "data"), "--cache", Path.Combine(_work, "cache"), "--state", Path.Combine(_work, "state"), .. more]);
        Assert.True(server.WaitForExit(StartLimit), $"the server kept running with {string.Join(' ', more)}");
        Assert.Equal(ServerArguments.UsageExitCode, server.ExitCode);
        Assert.Contains(expected, server.Output);
        Assert.DoesNotContain("   at ", server.Output); // no stack trace for a usage error
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(_work, recursive: true);
        }
        catch (IOException)
        {
        }
    }

    private static string RepositoryRoot()
    {
        for (var folder = new DirectoryInfo(AppContext.BaseDirectory); folder is not null; folder = folder.Parent)
            if (File.Exists(Path.Combine(folder.FullName, "Mosaic.sln"))) return folder.FullName;
        throw new InvalidOperationException("Mosaic.sln not found above the test folder");
    }
}
