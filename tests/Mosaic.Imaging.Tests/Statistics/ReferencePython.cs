using System.Runtime.InteropServices;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Imaging.Tests.Statistics;

/// <summary>
/// Runs a reference script under Debian's python3 (/usr/bin/python3, with python3-numpy and python3-astropy),
/// never a python found on PATH. A missing interpreter or package fails the test with a message saying what to install.
/// </summary>
internal static class ReferencePython
{
    // A failed import fails the run with the install command (Mosaic.Testing.DebianPython).
    public const string Prelude = """
        import sys, json, warnings
        import numpy as np
        from astropy.io import fits
        """;

    /// <summary>Runs <paramref name="script"/> (after <see cref="Prelude"/>) in <paramref name="workingDirectory"/>.</summary>
    public static void Run(string script, string workingDirectory) =>
        DebianPython.RunCode(Prelude + "\n" + script, workingDirectory: workingDirectory);

    public static float[] ReadFloat32(string path) => MemoryMarshal.Cast<byte, float>(File.ReadAllBytes(path)).ToArray();

    public static double[] ReadFloat64(string path) => MemoryMarshal.Cast<byte, double>(File.ReadAllBytes(path)).ToArray();

    public static JsonElement ReadJson(string path) => JsonDocument.Parse(File.ReadAllBytes(path)).RootElement.Clone();
}
