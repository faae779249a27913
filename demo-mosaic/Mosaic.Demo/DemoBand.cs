using System.Text.RegularExpressions;

namespace Mosaic.Demo;

/// <summary>
/// One pass band of the demo camera: its file name and FILTER value, sky, seeing and throughput, and how bright the
/// nebula's three components are in it. Electrons are per pixel over the whole exposure.
/// </summary>
/// <param name="Name">File stem and FILTER value: lower-case letters, digits, '-' or '_', at most 16 characters.</param>
/// <param name="SkyElectrons">Sky level at the field centre.</param>
/// <param name="SkyGradientEast">Fractional change of the sky across the field's width, towards the east.</param>
/// <param name="SkyGradientNorth">Fractional change of the sky across the field's height, towards the north.</param>
/// <param name="PsfFwhmPixels">Full width at half maximum of the Moffat stellar profile.</param>
/// <param name="PsfBeta">Moffat β (3 is typical of ground-based seeing).</param>
/// <param name="ZeroPoint">Magnitude that gives one electron in the exposure.</param>
/// <param name="ColourTerm">Band magnitude = catalogue magnitude + ColourTerm × colour index.</param>
public sealed record DemoBand(
    string Name,
    double SkyElectrons,
    double SkyGradientEast,
    double SkyGradientNorth,
    double PsfFwhmPixels,
    double PsfBeta,
    double ZeroPoint,
    double ColourTerm,
    double NebulaShellElectrons,
    double NebulaCoreElectrons,
    double NebulaDiffuseElectrons,
    double ExposureSeconds)
{
    private static readonly Regex ValidName = new("^[a-z][a-z0-9_-]{0,15}$", RegexOptions.CultureInvariant);

    /// <summary>Dark sky, the widest seeing; the nebula is faint here apart from a bluish diffuse glow.</summary>
    public static DemoBand Blue { get; } = new("blue", 460, 0.04, 0.015, 3.9, 3.2, 27.3, 0.45, 90, 380, 170, 360);

    /// <summary>The compact core of the nebula is brightest here.</summary>
    public static DemoBand Green { get; } = new("green", 880, -0.02, 0.03, 3.55, 3.0, 27.9, 0.0, 300, 1800, 110, 300);

    /// <summary>Brightest sky, sharpest seeing; the filamentary shell of the nebula dominates.</summary>
    public static DemoBand Red { get; } = new("red", 1350, 0.03, -0.025, 3.3, 2.85, 27.8, -0.35, 1600, 340, 130, 300);

    /// <summary>The three bands of every preset, bluest first.</summary>
    public static IReadOnlyList<DemoBand> Standard { get; } = [Blue, Green, Red];

    /// <summary>The band's file inside the field folder.</summary>
    public string FileName => Name + ".fits";

    /// <summary>Throws <see cref="ArgumentException"/> naming the first parameter out of range.</summary>
    public void Validate()
    {
        if (Name is null || !ValidName.IsMatch(Name))
            throw new ArgumentException($"Band name '{Name}' must be 1-16 characters: a lower-case letter, then lower-case letters, digits, '-' or '_'.", nameof(Name));
        Require(SkyElectrons is > 0 and <= 50_000, nameof(SkyElectrons), "must be in (0, 50000] electrons");
        Require(Math.Abs(SkyGradientEast) < 0.5, nameof(SkyGradientEast), "must be a fraction in (-0.5, 0.5)");
        Require(Math.Abs(SkyGradientNorth) < 0.5, nameof(SkyGradientNorth), "must be a fraction in (-0.5, 0.5)");
        Require(PsfFwhmPixels is >= 1.5 and <= 20, nameof(PsfFwhmPixels), "must be in [1.5, 20] pixels");
        Require(PsfBeta is > 1.5 and <= 10, nameof(PsfBeta), "must be in (1.5, 10]");
        Require(ZeroPoint is >= 15 and <= 35, nameof(ZeroPoint), "must be in [15, 35] magnitudes");
        Require(Math.Abs(ColourTerm) <= 2, nameof(ColourTerm), "must be in [-2, 2]");
        Require(NebulaShellElectrons is >= 0 and <= 50_000, nameof(NebulaShellElectrons), "must be in [0, 50000] electrons");
        Require(NebulaCoreElectrons is >= 0 and <= 50_000, nameof(NebulaCoreElectrons), "must be in [0, 50000] electrons");
        Require(NebulaDiffuseElectrons is >= 0 and <= 50_000, nameof(NebulaDiffuseElectrons), "must be in [0, 50000] electrons");
        Require(ExposureSeconds is > 0 and <= 100_000, nameof(ExposureSeconds), "must be in (0, 100000] seconds");
    }

    private void Require(bool condition, string parameter, string rule)
    {
        if (!condition) throw new ArgumentException($"Band '{Name}': {parameter} {rule}.", parameter);
    }
}
