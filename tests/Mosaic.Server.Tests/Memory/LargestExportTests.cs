using System.Buffers.Binary;
using System.Net;
using System.Text.Json;
using Mosaic.Demo;
using Mosaic.Server.Rendering;
using Mosaic.Server.Hosting;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Memory;

/// <summary>
/// A server under its default (derived) heap limit, on the default demo field (3 bands of 8 chips, 67 Mpx each, and
/// three 8440 x 8284 canvases): its 27 pyramids build (two at once on two cores, PyramidService.ConcurrentBuilds),
/// and the largest exports succeed: render.png of a 50-megapixel box
/// in gray and as an RGB composite, and a FITS cutout at the default 64-megapixel cap. An OutOfMemoryException
/// under the limit would be a 500 here. The files are checked by Debian's python3-pil (the PNG decodes whole, at
/// the asked size) and python3-astropy (the FITS header and data shape), and by the PNG specification's IHDR layout
/// (W3C PNG 2003 / ISO 15948, 11.2.2) and FITS 4.0's 2880-byte blocks (section 3.1).
/// </summary>
public sealed class LargestExportTests : IDisposable
{
    private readonly string _work = Path.Combine(Path.GetTempPath(), $"mosaic-export-{Guid.NewGuid():N}");

    [Fact]
    public async Task TheLargestExportsSucceedUnderTheDefaultLimit()
    {
        DemoFieldGenerator.Generate(DemoFieldOptions.Default(Path.Combine(_work, "data", "demo")));
        using var server = RealServer.Start(["--data", Path.Combine(_work, "data"), "--cache", Path.Combine(_work, "cache"), "--state", Path.Combine(_work, "state")]);
        var limit = await server.WaitForLineAsync(l => l.Contains("GC heap limit", StringComparison.Ordinal), TimeSpan.FromSeconds(90));
        Assert.Contains("small objects", limit); // the derived limit, not the GC's own

        using var http = new HttpClient { BaseAddress = server.BaseAddress, Timeout = TimeSpan.FromMinutes(5) };
        await WaitForPyramids(http, server, TimeSpan.FromMinutes(10));

        // The largest box render.png takes: 7000 columns and as many rows as stay within its pixel cap.
        const int width = 7000;
        var height = (int)(RegionImageService.MaxPixels / width);
        var box = $"hdu=canvas&x0=1&y0=1&x1={width}&y1={height}";
        var gray = await Download(http, $"/api/fields/demo/render.png?band=red&{box}", "gray.png");
        // The gray palette gives gray, gray + alpha, or RGB where masked pixels (the canvas between chips) get a colour.
        AssertPng(gray, width, height, colourTypes: [0, 2, 4]);
        var colour = await Download(http, $"/api/fields/demo/render.png?rgb=each&red=red&green=green&blue=blue&{box}", "colour.png");
        AssertPng(colour, width, height, colourTypes: [2, 6]);

        // The default cutout cap, 64 Mpx, as the square of 8192 that the canvas holds.
        const int side = 8192;
        Assert.Equal((long)side * side, MosaicOptions.DefaultCutoutPixelLimit);
        var cutout = await Download(http, $"/api/fields/demo/cutout.fits?band=red&hdu=canvas&x0=1&y0=1&x1={side}&y1={side}", "cutout.fits");
        Assert.Equal(0, new FileInfo(cutout).Length % 2880);
        var fits = JsonDocument.Parse(DebianPython.RunCode("""
            import json, sys
            from astropy.io import fits
            with fits.open(sys.argv[1], memmap=True) as f:
                h, d = f[0].header, f[0].data
                print(json.dumps({"bitpix": h["BITPIX"], "naxis1": h["NAXIS1"], "naxis2": h["NAXIS2"], "shape": list(d.shape)}))
            """, [cutout])).RootElement;
        Assert.Equal(-32, fits.GetProperty("bitpix").GetInt32());
        Assert.Equal(side, fits.GetProperty("naxis1").GetInt32());
        Assert.Equal(side, fits.GetProperty("naxis2").GetInt32());
        Assert.Equal([side, side], fits.GetProperty("shape").EnumerateArray().Select(e => e.GetInt32()));

        Assert.False(server.HasExited, server.Output);
        Assert.DoesNotContain("OutOfMemoryException", server.Output);
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(_work, recursive: true);
        }
        catch (IOException)
        {
        }
    }

    private async Task<string> Download(HttpClient http, string path, string name)
    {
        using var response = await http.GetAsync(path, HttpCompletionOption.ResponseHeadersRead);
        if (response.StatusCode != HttpStatusCode.OK)
            Assert.Fail($"{path}: {(int)response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        var file = Path.Combine(_work, name);
        await using (var output = File.Create(file)) await response.Content.CopyToAsync(output);
        return file;
    }

    private static void AssertPng(string file, int width, int height, int[] colourTypes)
    {
        var head = new byte[26];
        using (var stream = File.OpenRead(file)) stream.ReadExactly(head);
        Assert.Equal(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A }, head[..8]);
        Assert.Equal("IHDR"u8.ToArray(), head[12..16]);
        Assert.Equal(width, BinaryPrimitives.ReadInt32BigEndian(head.AsSpan(16)));
        Assert.Equal(height, BinaryPrimitives.ReadInt32BigEndian(head.AsSpan(20)));
        Assert.Contains(head[25], colourTypes.Select(t => (byte)t));
        // Pillow decodes every row: a truncated or corrupt stream raises.
        var size = DebianPython.RunCode("""
            import sys
            from PIL import Image
            Image.MAX_IMAGE_PIXELS = None
            with Image.open(sys.argv[1]) as im:
                im.load()
                print(im.size[0], im.size[1])
            """, [file]).Trim();
        Assert.Equal($"{width} {height}", size);
    }

    private static async Task WaitForPyramids(HttpClient http, RealServer server, TimeSpan limit)
    {
        var deadline = DateTime.UtcNow + limit;
        while (true)
        {
            Assert.False(server.HasExited, $"the server exited:\n{server.Output}");
            var states = new List<string>();
            try
            {
                using var field = JsonDocument.Parse(await http.GetStringAsync("/api/fields/demo"));
                Collect(field.RootElement, states);
            }
            catch (HttpRequestException)
            {
            }
            Assert.DoesNotContain("failed", states);
            if (states.Count > 0 && states.All(s => s == "ready")) return;
            if (DateTime.UtcNow > deadline) Assert.Fail($"pyramids not ready after {limit.TotalMinutes} min: {string.Join(",", states)}\n{server.Output}");
            await Task.Delay(500);
        }
    }

    private static void Collect(JsonElement element, List<string> states)
    {
        if (element.ValueKind == JsonValueKind.Object)
        {
            foreach (var property in element.EnumerateObject())
            {
                if (property.Name == "pyramid" && property.Value.ValueKind == JsonValueKind.Object && property.Value.TryGetProperty("state", out var state))
                    states.Add(state.GetString() ?? "");
                else Collect(property.Value, states);
            }
        }
        else if (element.ValueKind == JsonValueKind.Array)
        {
            foreach (var item in element.EnumerateArray()) Collect(item, states);
        }
    }
}
