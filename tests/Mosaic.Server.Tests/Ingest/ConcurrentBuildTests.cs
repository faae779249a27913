using System.Diagnostics;
using System.Text.Json;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.Server.Fields;
using Mosaic.Server.Hosting;
using Mosaic.Server.Pyramids;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Ingest;

/// <summary>
/// The pyramid service runs up to <see cref="PyramidService.ConcurrentBuilds"/> builds at once and never more (the
/// memory bound), each build keeps its own statistics and its own build time. Three single-frame files written by
/// astropy.io.fits (Debian python3-astropy); numpy gives each file's pixel count, NaN count, min and max.
/// </summary>
public sealed class ConcurrentBuildTests : IDisposable
{
    private const int Files = 3;

    private const string WriterScript = """
import json, sys, os
import numpy as np
from astropy.io import fits
root = sys.argv[1]
rng = np.random.default_rng(23)
out = []
for k in range(3):
    data = rng.normal(50.0 * (k + 1), 3.0, size=(2048, 2048)).astype(np.float32)
    data[::101, ::7] = np.nan
    folder = os.path.join(root, f"frame{k}")
    os.makedirs(folder)
    fits.PrimaryHDU(data).writeto(os.path.join(folder, "frame.fits"))
    finite = data[np.isfinite(data)]
    out.append({"field": f"frame{k}", "count": int(finite.size), "masked": int(data.size - finite.size),
                "min": float(finite.min()), "max": float(finite.max())})
print(json.dumps(out))
""";

    private readonly string _root = Directory.CreateTempSubdirectory("mosaic-concurrent-builds-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_root, recursive: true); } catch (IOException) { }
    }

    [Fact]
    public async Task Builds_overlap_up_to_the_bound_and_each_keeps_its_own_statistics_and_time()
    {
        var data = Path.Combine(_root, "data");
        Directory.CreateDirectory(data);
        using var reference = JsonDocument.Parse(DebianPython.RunCode(WriterScript, [data]));
        var options = MosaicOptions.FromConfiguration(new ConfigurationBuilder().AddInMemoryCollection(
            new Dictionary<string, string?> { ["data"] = data, ["cache"] = Path.Combine(_root, "cache") }).Build());
        await using var services = new ServiceCollection().AddLogging().AddMosaic(options).BuildServiceProvider();
        var catalog = services.GetRequiredService<FieldCatalog>();
        catalog.RefreshIfStale();
        // As the ingest command does: a service whose own catalog never scans, so it builds only what it is asked about.
        using var pyramids = ActivatorUtilities.CreateInstance<PyramidService>(services, ActivatorUtilities.CreateInstance<FieldCatalog>(services));
        var hdus = catalog.Fields.OrderBy(f => f.Id, StringComparer.Ordinal).SelectMany(f => f.Bands).SelectMany(b => b.Hdus).ToList();
        Assert.Equal(Files, hdus.Count);
        foreach (var hdu in hdus) Assert.Equal(PyramidState.Queued, pyramids.GetStatus(hdu).State);

        var clock = Stopwatch.StartNew();
        await pyramids.StartAsync(CancellationToken.None);
        var mostBuilding = 0;
        try
        {
            while (true)
            {
                var states = hdus.Select(h => pyramids.GetStatus(h).State).ToList();
                mostBuilding = Math.Max(mostBuilding, states.Count(s => s == PyramidState.Building));
                Assert.DoesNotContain(PyramidState.Failed, states);
                if (states.All(s => s == PyramidState.Ready)) break;
                Assert.True(clock.Elapsed < TimeSpan.FromMinutes(5), "the builds did not finish in five minutes");
                Thread.Sleep(1);
            }
        }
        finally
        {
            await pyramids.StopAsync(CancellationToken.None);
        }
        var total = clock.Elapsed;

        // Two cores here: three queued builds, so two run at once at some point, and never a third (the memory bound).
        Assert.Equal(Math.Min(2, Environment.ProcessorCount), PyramidService.ConcurrentBuilds);
        Assert.Equal(PyramidService.ConcurrentBuilds, mostBuilding);
        foreach (var expected in reference.RootElement.EnumerateArray())
        {
            var hdu = hdus.Single(h => h.Band.Field.Id == expected.GetProperty("field").GetString());
            var statistics = pyramids.GetReady(hdu).Statistics;
            // numpy on the same pixels: builds running side by side never mix their histograms.
            Assert.Equal(expected.GetProperty("count").GetInt64(), statistics.Count);
            Assert.Equal(expected.GetProperty("masked").GetInt64(), statistics.Masked);
            Assert.Equal(expected.GetProperty("min").GetDouble(), statistics.Min);
            Assert.Equal(expected.GetProperty("max").GetDouble(), statistics.Max);
            // Each build's own time: more than nothing, and within the whole run (not the gap between two finishes).
            var took = pyramids.GetStatus(hdu).BuildTime;
            Assert.NotNull(took);
            Assert.InRange(took.Value, TimeSpan.FromTicks(1), total);
        }
    }
}
