using Mosaic.Testing;

namespace Mosaic.Fits.Tests.Support;

/// <summary>
/// Runs the reference scripts in Astropy/ with Debian's /usr/bin/python3 and its python3-astropy (never a python on
/// PATH, which may lack astropy or be another version). Missing pieces fail the test with the install command.
/// </summary>
public static class Astropy
{
    public static string ScriptFolder => Path.Combine(AppContext.BaseDirectory, "Astropy");

    /// <summary>Runs a script from <see cref="ScriptFolder"/>; returns its stdout, or throws with its stderr.</summary>
    public static string Run(string script, params string[] arguments) =>
        DebianPython.RunFile(Path.Combine(ScriptFolder, script), arguments, workingDirectory: ScriptFolder);
}
