using Mosaic.Fits;

namespace Mosaic.Server.Fields;

/// <summary>
/// Groups every image HDU of a field's files into bands by <see cref="FieldNaming.BandName"/>, names compared
/// case-insensitively, bands in the order they first appear. A file that cannot be shown joins the band its file
/// name gives, so a band keeps the errors of its own files; where no other file has that band, it is a band of
/// its own that shows the error.
/// </summary>
internal static class BandGrouping
{
    public static void Group(Field field, IReadOnlyList<FieldFile> files, string? folderName)
    {
        var bands = new List<Pending>();
        var byName = new Dictionary<string, Pending>(StringComparer.OrdinalIgnoreCase);
        foreach (var file in files)
        {
            var primaryFilter = file.Fits is { Hdus.Count: > 0 } fits ? Filter(fits.Hdus[0]) : null;
            if (file.Error is not null)
            {
                BandOf(FieldNaming.BandName(null, primaryFilter, file.Name, folderName)).Add(file);
                continue;
            }
            foreach (var (hdu, plane) in file.Images)
            {
                var pending = BandOf(FieldNaming.BandName(Filter(hdu), primaryFilter, file.Name, folderName));
                pending.Add(file);
                pending.Images.Add((file, hdu, plane));
            }
        }
        foreach (var pending in bands)
        {
            var band = new FieldBand(field, pending.Name);
            band.Attach(pending.Files, pending.Images);
            field.Add(band);
        }
        field.SetFiles(files);

        Pending BandOf(string name)
        {
            if (byName.TryGetValue(name, out var found)) return found;
            found = new Pending(name);
            byName[name] = found;
            bands.Add(found);
            return found;
        }
    }

    private static string? Filter(Hdu hdu) => hdu.Header.GetString("FILTER") is { } filter && !string.IsNullOrWhiteSpace(filter) ? filter : null;

    private sealed class Pending(string name)
    {
        public string Name { get; } = name;

        public List<FieldFile> Files { get; } = [];

        public List<(FieldFile File, Hdu Hdu, ImagePlane Plane)> Images { get; } = [];

        public void Add(FieldFile file)
        {
            if (Files.Count == 0 || !ReferenceEquals(Files[^1], file)) Files.Add(file);
        }
    }
}
