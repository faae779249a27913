using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests;

public sealed class DisplayParameterTests(DisplayReference reference) : IClassFixture<DisplayReference>
{
    private HttpClient Client => reference.Client;

    private async Task<(byte[] Png, string ETag)> TileAsync(string query)
    {
        var response = await Client.GetAsync($"/tiles/single/2/0/0.png?{query}");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        return (await response.Content.ReadAsByteArrayAsync(), response.Headers.ETag!.Tag);
    }

    [Fact]
    public async Task A_tile_changes_when_the_stretch_changes()
    {
        var linear = await TileAsync("stretch=linear&lo=60&hi=110");
        var sqrt = await TileAsync("stretch=sqrt&lo=60&hi=110");
        var asinh = await TileAsync("");
        Assert.NotEqual(linear.ETag, sqrt.ETag);
        Assert.NotEqual(linear.ETag, asinh.ETag);
        Assert.False(linear.Png.AsSpan().SequenceEqual(sqrt.Png), "sqrt and linear tiles have the same bytes");
        Assert.False(linear.Png.AsSpan().SequenceEqual(asinh.Png), "default and linear tiles have the same bytes");
    }

    [Theory]
    [InlineData("", "limits=auto&stretch=asinh&pivot=lo&palette=gray&masked=transparent")]
    [InlineData("stretch=linear&lo=100&hi=200", "limits=value&lo=1e2&hi=200.000&stretch=LINEAR&gamma=3")]
    [InlineData("plo=0.5", "limits=percentile&phi=99.5&plo=.5")]
    [InlineData("limits=robust", "klo=2&khi=20")]
    [InlineData("stretch=power", "stretch=power&gamma=2.0")]
    [InlineData("stretch=log", "stretch=log&a=1000")]
    [InlineData("palette=cubehelix", "palette=cubehelix&ch-start=0.5&ch-rot=-1.5&ch-hue=1&ch-gamma=1")]
    [InlineData("stretch=asinh&soft=4&pivot=-0", "soft=4.0&pivot=0")]
    [InlineData("masked=FF00aa", "masked=ff00AA")]
    public async Task Equivalent_spellings_give_the_same_tile_and_etag(string one, string other)
    {
        var a = await TileAsync(one);
        var b = await TileAsync(other);
        Assert.Equal(a.ETag, b.ETag);
        Assert.True(a.Png.AsSpan().SequenceEqual(b.Png));
        var keyA = (await Client.GetFromJsonAsync<JsonElement>($"/api/fields/single/display?{one}")).GetProperty("key").GetString();
        var keyB = (await Client.GetFromJsonAsync<JsonElement>($"/api/fields/single/display?{other}")).GetProperty("key").GetString();
        Assert.Equal(keyA, keyB);
    }

    public static TheoryData<string, string> BadParameters => new()
    {
        { "limits=magic", "limits" },
        { "lo=5", "hi" },
        { "hi=5", "lo" },
        { "lo=abc&hi=5", "lo" },
        { "lo=10&hi=5", "hi" },
        { "lo=10&hi=10", "hi" },
        { "lo=100&hi=100.00001", "hi" },
        { "lo=1e39&hi=1e40", "lo" },
        { "lo=1&hi=2&plo=1", "plo" },
        { "limits=value&plo=1", "plo" },
        { "limits=auto&klo=1", "klo" },
        { "limits=percentile&lo=1", "lo" },
        { "plo=-1", "plo" },
        { "plo=100", "plo" },
        { "phi=101", "phi" },
        { "plo=50&phi=40", "phi" },
        { "klo=-1", "klo" },
        { "khi=0", "khi" },
        { "khi=NaN", "khi" },
        { "stretch=cubic", "stretch" },
        { "stretch=power&gamma=0", "gamma" },
        { "stretch=power&gamma=-2", "gamma" },
        { "stretch=log&a=0", "a" },
        { "stretch=log&a=Infinity", "a" },
        { "soft=0", "soft" },
        { "soft=-3", "soft" },
        { "pivot=middle", "pivot" },
        { "pivot=1e40", "pivot" },
        { "palette=rainbow", "palette" },
        { "palette=cubehelix&ch-start=4", "ch-start" },
        { "palette=cubehelix&ch-rot=11", "ch-rot" },
        { "palette=cubehelix&ch-hue=-1", "ch-hue" },
        { "palette=cubehelix&ch-gamma=0", "ch-gamma" },
        { "palette=cubehelix&ch-gamma=11", "ch-gamma" },
        { "masked=%23ff00ff", "masked" },
        { "masked=red", "masked" },
        { "masked=12345", "masked" },
        { "masked=gg0000", "masked" },
    };

    [Theory]
    [MemberData(nameof(BadParameters))]
    public async Task Every_bad_display_parameter_gets_400_naming_it_on_tiles_renders_and_displays(string query, string parameter)
    {
        await RenderEndpointTests.AssertBadParameter(await Client.GetAsync($"/tiles/single/1/0/0.png?{query}"), parameter);
        await RenderEndpointTests.AssertBadParameter(await Client.GetAsync($"/api/fields/single/render.png?x0=1&y0=1&x1=5&y1=5&{query}"), parameter);
        await RenderEndpointTests.AssertBadParameter(await Client.GetAsync($"/api/fields/single/display?{query}"), parameter);
    }

    [Theory]
    [InlineData("/api/fields/trio/histogram?bins=0", "bins")]
    [InlineData("/api/fields/trio/histogram?bins=4097", "bins")]
    [InlineData("/api/fields/trio/histogram?bins=2.5", "bins")]
    [InlineData("/api/fields/trio/histogram?lo=10&hi=5", "hi")]
    [InlineData("/api/fields/trio/histogram?lo=1e9", "lo")]
    [InlineData("/api/fields/trio/histogram?hi=x", "hi")]
    [InlineData("/api/fields/trio/histogram?scale=cubic", "scale")]
    [InlineData("/api/fields/trio/histogram?scale=log&lo=-1&hi=5", "lo")]
    [InlineData("/api/fields/single/stats?x0=1", "y0")]
    [InlineData("/api/fields/single/stats?x0=1&y0=1&x1=700&y1=5", "x1")]
    public async Task Bad_histogram_and_statistics_parameters_get_400_naming_them(string url, string parameter) =>
        await RenderEndpointTests.AssertBadParameter(await Client.GetAsync(url), parameter);

    [Fact]
    public async Task The_OpenAPI_document_lists_the_display_parameters_with_descriptions()
    {
        var doc = await Client.GetFromJsonAsync<JsonElement>("/openapi/v1.json");
        var paths = doc.GetProperty("paths");
        string[] display = ["limits", "lo", "hi", "plo", "phi", "klo", "khi", "stretch", "gamma", "a", "soft", "pivot", "palette", "ch-start", "ch-rot", "ch-hue", "ch-gamma", "masked"];
        foreach (var (path, own) in new[]
                 {
                     ("/tiles/{field}/{z}/{x}/{y}.png", new[] { "band", "hdu", "v" }),
                     ("/api/fields/{field}/render.png", new[] { "band", "hdu", "x0", "y0", "x1", "y1" }),
                     ("/api/fields/{field}/display", new[] { "band" }),
                 })
        {
            var parameters = paths.GetProperty(path).GetProperty("get").GetProperty("parameters").EnumerateArray()
                .Where(p => p.GetProperty("in").GetString() == "query")
                .ToDictionary(p => p.GetProperty("name").GetString()!);
            foreach (var name in display.Concat(own))
            {
                Assert.True(parameters.ContainsKey(name), $"{path} does not document '{name}'");
                Assert.False(string.IsNullOrWhiteSpace(parameters[name].GetProperty("description").GetString()), $"{path}: '{name}' has no description");
            }
        }
        foreach (var path in new[] { "/api/fields/{field}/stats", "/api/fields/{field}/histogram", "/api/palettes" })
            Assert.True(paths.TryGetProperty(path, out _), $"{path} is missing");
    }
}
