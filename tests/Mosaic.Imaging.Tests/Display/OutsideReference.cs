using System.Runtime.InteropServices;
using Mosaic.Testing;

namespace Mosaic.Imaging.Tests.Display;

/// <summary>
/// Runs a check script under Debian's /usr/bin/python3 (python3-numpy, python3-astropy, python3-pil), never a
/// python found on PATH. A missing interpreter or package fails the test, naming the Debian package to install.
/// </summary>
internal static class OutsideReference
{
    // A failed import fails the run with the install command (Mosaic.Testing.DebianPython).
    private const string Prelude = """
        import sys, json
        import numpy as np
        import astropy
        from astropy.visualization import AsinhStretch, LinearStretch, ManualInterval
        from PIL import Image
        """;

    /// <summary>Runs the script (after the prelude) in <paramref name="folder"/> and returns what it printed.</summary>
    public static string Run(string script, string folder) => DebianPython.RunCode(Prelude + "\n" + script, workingDirectory: folder);

    public static void WriteFloat64(string path, ReadOnlySpan<double> values) => File.WriteAllBytes(path, MemoryMarshal.AsBytes(values).ToArray());

    public static void WriteFloat32(string path, ReadOnlySpan<float> values) => File.WriteAllBytes(path, MemoryMarshal.AsBytes(values).ToArray());

    public static double[] ReadFloat64(string path) => MemoryMarshal.Cast<byte, double>(File.ReadAllBytes(path)).ToArray();
}
