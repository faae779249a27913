using Mosaic.Demo.Camera;
using Mosaic.Demo.Scene;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Rendering;

/// <summary>
/// Sky background plus nebula for one chip and band, evaluated through the chip's WCS on a grid of nodes every few
/// pixels and interpolated bilinearly. Both vary slowly on that scale, and the grid keeps the per-pixel cost to one
/// interpolation instead of a WCS transform and a dozen noise octaves.
/// </summary>
internal sealed class SmoothLayer
{
    private float[] _nodes = [];
    private float[] _nodeRow = [];
    private int _columns;
    private int _rows;
    private int _step;
    private int _width;

    /// <summary>Grid spacing in pixels: fine enough for the nebula's smallest filaments at this field's scale.</summary>
    public static int StepFor(DemoScene scene)
    {
        var shellPixels = scene.Nebula.ShellRadiusArcsec / DemoScene.PixelScaleArcsec;
        return Math.Clamp((int)(shellPixels / 200), 2, 8);
    }

    public void Build(DemoScene scene, int bandIndex, ChipLayout chip)
    {
        _step = StepFor(scene);
        _width = chip.Width;
        _columns = (chip.Width - 1) / _step + 2;
        _rows = (chip.Height - 1) / _step + 2;
        if (_nodes.Length < _columns * _rows) _nodes = new float[_columns * _rows];
        if (_nodeRow.Length < _columns) _nodeRow = new float[_columns];

        var band = scene.Options.Bands[bandIndex];
        var background = scene.Backgrounds[bandIndex];
        var nebula = scene.Nebula;
        var field = scene.NebulaField;
        Gnomonic.TryToPlane(scene.FieldCentre, nebula.Centre, out var nebulaXi, out var nebulaEta);
        var outerDegrees = nebula.OuterRadiusArcsec / 3600.0;
        var reach2 = Math.Pow(1.05 * outerDegrees, 2);
        var perShellRadius = 3600.0 / nebula.ShellRadiusArcsec;
        var wcs = chip.Wcs;

        for (var j = 0; j < _rows; j++)
        for (var i = 0; i < _columns; i++)
        {
            var pixel = new PixelPosition(i * _step, j * _step);
            var sky = wcs.PixelToSky(pixel);
            // CRVAL is the field centre, so the plane about it is the background's coordinate system.
            Gnomonic.TryToPlane(scene.FieldCentre, sky, out var xi, out var eta);
            var value = background.ElectronsAt(xi, eta);
            var dXi = xi - nebulaXi;
            var dEta = eta - nebulaEta;
            if (dXi * dXi + dEta * dEta < reach2 && Gnomonic.TryToPlane(nebula.Centre, sky, out var nx, out var ny))
                value += field.Evaluate(nx * perShellRadius, ny * perShellRadius).InBand(band);
            _nodes[j * _columns + i] = (float)value;
        }
    }

    public void FillRow(int y, Span<float> row)
    {
        var j = y / _step;
        var t = (float)(y - j * _step) / _step;
        var below = _nodes.AsSpan(j * _columns, _columns);
        var above = _nodes.AsSpan((j + 1) * _columns, _columns);
        var mixed = _nodeRow.AsSpan(0, _columns);
        for (var i = 0; i < _columns; i++) mixed[i] = below[i] + (above[i] - below[i]) * t;
        var invStep = 1f / _step;
        for (var i = 0; i < _columns - 1; i++)
        {
            var a = mixed[i];
            var slope = (mixed[i + 1] - a) * invStep;
            var x0 = i * _step;
            var count = Math.Min(_step, _width - x0);
            for (var k = 0; k < count; k++) row[x0 + k] = a + slope * k;
        }
    }
}
