namespace Mosaic.Browser.Tests.Hosting;

/// <summary>Where the server's build output and project folder are, found from this test assembly's own folder.</summary>
public static class RepositoryLayout
{
    public static string Root { get; } = FindRoot();

    public static string ServerProjectDirectory => Path.Combine(Root, "server", "Mosaic.Server");

    /// <summary>Mosaic.Server.dll as built for the same configuration as these tests (bin/Debug or bin/Release).</summary>
    public static string ServerAssembly
    {
        get
        {
            // Test output: tests/Mosaic.Browser.Tests/bin/<Configuration>/<framework>/
            var framework = new DirectoryInfo(AppContext.BaseDirectory.TrimEnd(Path.DirectorySeparatorChar));
            var configuration = framework.Parent?.Name ?? "Debug";
            var path = Path.Combine(ServerProjectDirectory, "bin", configuration, framework.Name, "Mosaic.Server.dll");
            if (!File.Exists(path))
                throw new FileNotFoundException($"The server is not built at {path}: build server/Mosaic.Server (the test project references it).", path);
            return path;
        }
    }

    private static string FindRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
            if (File.Exists(Path.Combine(dir.FullName, "Mosaic.sln"))) return dir.FullName;
        throw new DirectoryNotFoundException($"No Mosaic.sln above {AppContext.BaseDirectory}");
    }
}
