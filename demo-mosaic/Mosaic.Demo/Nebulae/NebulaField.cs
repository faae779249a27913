namespace Mosaic.Demo.Nebulae;

/// <summary>
/// The emission nebula as a function of position, in units of its shell radius about its centre: an irregular,
/// filamentary shell, a compact knotty core and a patchy diffuse glow, all shaped by procedural noise and cut off
/// smoothly at <see cref="OuterRadius"/> so nothing of it reaches beyond.
/// </summary>
internal sealed class NebulaField
{
    /// <summary>Nothing of the nebula lies beyond this radius (in shell radii).</summary>
    public const double OuterRadius = 1.6;

    /// <summary>Gaussian radius of the core, in shell radii.</summary>
    public const double CoreRadius = 0.12;

    private const double ShellThickness = 0.085;
    private readonly ValueNoise _noise;

    public NebulaField(ulong seed) => _noise = new ValueNoise(seed);

    public NebulaComponents Evaluate(double x, double y)
    {
        var plainRadius = Math.Sqrt(x * x + y * y);
        if (plainRadius >= OuterRadius) return default;
        var window = 1 - SmoothStep(1.3, OuterRadius, plainRadius);

        // Domain warp bends every structure so nothing looks like a perfect circle.
        var wx = _noise.Fractal(x * 1.7 + 3.1, y * 1.7 + 7.7, 4) - 0.5;
        var wy = _noise.Fractal(x * 1.7 + 9.2, y * 1.7 + 1.3, 4) - 0.5;
        var qx = x + 0.35 * wx;
        var qy = y + 0.35 * wy;
        var r = Math.Sqrt(qx * qx + qy * qy);

        // Shell: a thin ring whose radius wanders by ±12 %, bright where ridged noise makes filaments.
        var shellRadius = 1 + 0.24 * (_noise.Fractal(qx * 1.3 + 11.0, qy * 1.3 - 5.0, 3) - 0.5);
        var d = (r / shellRadius - 1) / ShellThickness;
        var ridge = _noise.Ridged(qx * 5 + 17.0, qy * 5 - 23.0, 5);
        var filaments = Math.Pow(ridge, 1.5);
        var ring = Math.Exp(-d * d);
        var spill = Math.Exp(-Sq((r / shellRadius - 0.95) / 0.3));
        var shell = ring * (0.25 + 0.75 * filaments) + 0.45 * filaments * filaments * spill;

        // Core: compact, knotty.
        var core = Math.Exp(-0.5 * Sq(r / CoreRadius)) * (0.6 + 0.4 * _noise.Fractal(qx * 9 + 41.0, qy * 9 + 3.0, 4));

        // Diffuse: a broad patchy glow filling the shell.
        var patches = _noise.Fractal(x * 2.5 + 31.0, y * 2.5 - 13.0, 5);
        var diffuse = Math.Exp(-Sq(r / 0.85)) * 1.6 * patches * Math.Sqrt(patches);

        return new NebulaComponents(shell * window, core * window, diffuse * window);
    }

    private static double Sq(double v) => v * v;

    private static double SmoothStep(double edge0, double edge1, double x)
    {
        var t = Math.Clamp((x - edge0) / (edge1 - edge0), 0, 1);
        return t * t * (3 - 2 * t);
    }
}
