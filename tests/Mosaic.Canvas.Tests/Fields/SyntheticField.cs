using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Canvas.Tests.Fields;

/// <summary>A multi-extension FITS file of synthetic chips (one per IMAGE extension) in a temporary folder, opened for reading.</summary>
internal sealed class SyntheticField : IDisposable
{
    private readonly string _folder;
    private readonly FitsFile _file;

    public SyntheticField(double ra, double dec, IReadOnlyList<ChipSpec> specs)
    {
        Ra = ra; Dec = dec; Specs = specs;
        _folder = Path.Combine(Path.GetTempPath(), "mosaic-canvas-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(_folder);
        FilePath = Path.Combine(_folder, "field.fits");
        using (var writer = new FitsWriter(File.Create(FilePath)))
        {
            writer.WriteEmptyPrimary([]);
            foreach (var spec in specs)
            {
                var data = new float[spec.Width * spec.Height];
                for (var y = 0; y < spec.Height; y++)
                    for (var x = 0; x < spec.Width; x++) data[y * spec.Width + x] = spec.Values(x, y);
                var cards = spec.Cards(ra, dec).Select(c => new HeaderCard(c.Key, c.Value, null)).ToList();
                cards.Insert(0, new HeaderCard("EXTNAME", spec.Name, null));
                writer.WriteFloatImage(cards, spec.Width, spec.Height, data);
            }
        }
        _file = FitsFile.Open(FilePath);
        Chips = specs.Select((spec, i) =>
        {
            var hdu = _file.Hdus[i + 1];
            return new CanvasChip(spec.Name, hdu.Index, hdu.Image!, Wcs.Wcs.From(hdu.Header));
        }).ToList();
    }

    public double Ra { get; }
    public double Dec { get; }
    public IReadOnlyList<ChipSpec> Specs { get; }
    public string FilePath { get; }
    public IReadOnlyList<CanvasChip> Chips { get; }
    public IReadOnlyList<ChipFootprint> Footprints => Chips.Select(c => c.Footprint).ToList();

    /// <summary>Chips as the reference script names them: this file, HDU 1.. in order.</summary>
    public IReadOnlyList<(string File, int Hdu)> ReferenceChips => Chips.Select(c => (FilePath, c.HduIndex)).ToList();

    public string TempPath(string name) => Path.Combine(_folder, name);

    public void Dispose()
    {
        _file.Dispose();
        try { Directory.Delete(_folder, recursive: true); } catch (IOException) { }
    }
}
