using System.Text.Json;
using Mosaic.Browser.Tests.Reference;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>
/// A three-band field made for the colour tests in the site's data folder (astropy writes it; see
/// Reference/colour_reference.py): one 128 x 128 chip per band, each band with one square source bright in it
/// alone, and a square of masked pixels in one band. The band names suggest wavelengths (650, 450, 550 nm) in an
/// order other than their listing order, so the default channels show whether the client reads them.
/// </summary>
public sealed record ColourField(string Id, string Folder, FieldInfo Info, IReadOnlyDictionary<string, (int X, int Y)> Sources, string MaskedBand, (int X, int Y) Masked)
{
    public const string FieldId = "tricolour";
    public const string Long = "a-650nm";
    public const string Short = "b-450nm";
    public const string Middle = "c-550nm";

    private static readonly SemaphoreSlim Gate = new(1, 1);
    private static ColourField? _made;

    public HduInfo Chip => Info.Band(Long).Hdus.Single();

    /// <summary>Writes the field once per test run and waits until the server has prepared its tiles.</summary>
    public static async Task<ColourField> EnsureAsync(MosaicSite site)
    {
        await Gate.WaitAsync();
        try
        {
            if (_made is not null) return _made;
            var folder = Path.Combine(site.DataDirectory, FieldId);
            var written = AstropyColour.WriteField(folder);
            var sources = written.GetProperty("sources").EnumerateObject()
                .ToDictionary(p => p.Name, p => (p.Value.GetProperty("x").GetInt32(), p.Value.GetProperty("y").GetInt32()));
            var masked = written.GetProperty("masked");
            var info = await WaitReadyAsync(site, TimeSpan.FromMinutes(2));
            _made = new ColourField(FieldId, folder, info, sources, masked.GetProperty("band").GetString()!,
                (masked.GetProperty("x").GetInt32(), masked.GetProperty("y").GetInt32()));
            return _made;
        }
        finally
        {
            Gate.Release();
        }
    }

    private static async Task<FieldInfo> WaitReadyAsync(MosaicSite site, TimeSpan limit)
    {
        var deadline = DateTime.UtcNow + limit;
        while (true)
        {
            try
            {
                var field = FieldInfo.Parse(await site.GetJsonAsync($"api/fields/{FieldId}"));
                var states = field.Bands.SelectMany(b => b.Hdus.Select(h => h.PyramidState)).ToList();
                if (states.Contains("failed")) throw new InvalidOperationException($"a pyramid of {FieldId} failed:\n{site.Server.RecentOutput}");
                if (field.Bands.Count == 3 && states.Count == 3 && states.All(s => s == "ready")) return field;
            }
            catch (InvalidOperationException e) when (e.Message.Contains("answered 404", StringComparison.Ordinal))
            {
                // The catalogue has not seen the new folder yet.
            }
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"{FieldId} not ready after {limit.TotalSeconds} s:\n{site.Server.RecentOutput}");
            await Task.Delay(250);
        }
    }
}
