using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests;

public sealed class FieldsEndpointTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task Lists_files_and_folders_as_fields_and_keeps_the_unreadable_one_with_its_error()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var fields = await client.GetFromJsonAsync<JsonElement>("/api/fields");
        var byId = fields.EnumerateArray().ToDictionary(f => f.GetProperty("id").GetString()!);

        Assert.Equal(["broken", "single", "trio"], byId.Keys.Order().ToArray());

        var broken = byId["broken"];
        Assert.Contains("broken.fits", broken.GetProperty("error").GetString());
        Assert.Contains("SIMPLE", broken.GetProperty("error").GetString());

        var single = byId["single"];
        Assert.Equal(JsonValueKind.Null, single.GetProperty("error").ValueKind);
        Assert.Equal(600, single.GetProperty("width").GetInt32());
        Assert.Equal(300, single.GetProperty("height").GetInt32());
        Assert.Equal(0, single.GetProperty("defaultHdu").GetInt32());
        var singleHdu = single.GetProperty("hdus")[0];
        Assert.Equal(16, singleHdu.GetProperty("bitpix").GetInt32());
        Assert.Equal("adu", singleHdu.GetProperty("bunit").GetString());
        Assert.Equal(2, singleHdu.GetProperty("maxZoom").GetInt32()); // 600 px needs 256 * 2^2 ≥ 600

        // Band names: FILTER where present, else the file-name rule strips the folder name ("trio_blue" → "blue").
        var trio = byId["trio"];
        var bands = trio.GetProperty("bands").EnumerateArray().Select(b => b.GetProperty("name").GetString()!).ToArray();
        Assert.Equal(["blue", "green", "red"], bands);
        // The primary HDU has no data, so the first image extension is the default.
        Assert.Equal(1, trio.GetProperty("defaultHdu").GetInt32());
        Assert.Equal(["CCD1", "CCD2"], trio.GetProperty("hdus").EnumerateArray().Select(h => h.GetProperty("name").GetString()!).ToArray());
    }

    [Fact]
    public async Task Probe_returns_the_value_astropy_reads_at_the_same_1_based_pixel()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        // Reference: astropy.io.fits (Debian python3-astropy) applies BZERO/BSCALE and turns BLANK into NaN.
        foreach (var (field, query, reference) in new[]
                 {
                     ("single", "", data.Reference.RootElement.GetProperty("single")),
                     ("trio", "&band=green&hdu=CCD2", data.Reference.RootElement.GetProperty("green_ccd2")),
                 })
        {
            foreach (var point in reference.EnumerateObject())
            {
                var xy = point.Name.Split(',').Select(int.Parse).ToArray();
                var probe = await client.GetFromJsonAsync<JsonElement>($"/api/fields/{field}/probe?x={xy[0]}&y={xy[1]}{query}");
                Assert.Equal(xy[0], probe.GetProperty("x").GetInt32());
                Assert.Equal(xy[1], probe.GetProperty("y").GetInt32());
                if (point.Value.ValueKind == JsonValueKind.Null)
                    Assert.Equal(JsonValueKind.Null, probe.GetProperty("value").ValueKind);
                else
                    Assert.Equal(point.Value.GetDouble(), probe.GetProperty("value").GetDouble(), 1e-4);
            }
        }
        // The BLANK pixel of 'single' at (21, 11) is masked: astropy reads NaN, the probe says null.
        Assert.Equal(JsonValueKind.Null, data.Reference.RootElement.GetProperty("single").GetProperty("21,11").ValueKind);
    }

    [Fact]
    public async Task Probe_takes_fractional_positions_to_the_containing_pixel()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        // FITS 4.0 section 8.1 / WCS Paper I: pixel centres are at integer coordinates, so pixel 5 spans [4.5, 5.5).
        var inside = await client.GetFromJsonAsync<JsonElement>("/api/fields/single/probe?x=5.49&y=294.5");
        Assert.Equal(5, inside.GetProperty("x").GetInt32());
        Assert.Equal(295, inside.GetProperty("y").GetInt32());
        var edge = await client.GetFromJsonAsync<JsonElement>("/api/fields/single/probe?x=0.5&y=300.49");
        Assert.Equal(1, edge.GetProperty("x").GetInt32());
        Assert.Equal(300, edge.GetProperty("y").GetInt32());
    }

    [Theory]
    [InlineData("/api/fields/single/probe?x=0.4&y=10", HttpStatusCode.BadRequest, "x")]
    [InlineData("/api/fields/single/probe?x=10&y=300.5", HttpStatusCode.BadRequest, "y")]
    [InlineData("/api/fields/single/probe?x=abc&y=10", HttpStatusCode.BadRequest, "x")]
    [InlineData("/api/fields/single/probe?x=NaN&y=10", HttpStatusCode.BadRequest, "x")]
    [InlineData("/api/fields/single/probe?y=10", HttpStatusCode.BadRequest, "x")]
    [InlineData("/api/fields/single/probe?x=1&y=1&hdu=7", HttpStatusCode.NotFound, "hdu")]
    [InlineData("/api/fields/trio/probe?x=1&y=1&hdu=CCD9", HttpStatusCode.NotFound, "hdu")]
    [InlineData("/api/fields/trio/probe?x=1&y=1&band=violet", HttpStatusCode.NotFound, "band")]
    [InlineData("/api/fields/nowhere/probe?x=1&y=1", HttpStatusCode.NotFound, "field")]
    public async Task Bad_probes_get_problem_details_naming_the_parameter(string url, HttpStatusCode status, string parameter)
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var response = await client.GetAsync(url);
        Assert.Equal(status, response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal((int)status, problem.GetProperty("status").GetInt32());
        Assert.Equal(parameter, problem.GetProperty("parameter").GetString());
        Assert.False(string.IsNullOrWhiteSpace(problem.GetProperty("detail").GetString()));
    }

    [Fact]
    public async Task The_unreadable_field_answers_with_a_problem_and_the_others_keep_serving()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var response = await client.GetAsync("/api/fields/broken/probe?x=1&y=1");
        Assert.Equal(HttpStatusCode.UnprocessableEntity, response.StatusCode);
        Assert.Contains("broken.fits", (await response.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("detail").GetString());
        var ok = await client.GetAsync("/api/fields/single/probe?x=1&y=1");
        Assert.Equal(HttpStatusCode.OK, ok.StatusCode);
    }

    [Fact]
    public async Task OpenApi_document_describes_the_endpoints()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var doc = await client.GetFromJsonAsync<JsonElement>("/openapi/v1.json");
        Assert.StartsWith("3.", doc.GetProperty("openapi").GetString());
        var paths = doc.GetProperty("paths").EnumerateObject().Select(p => p.Name).ToArray();
        Assert.Contains("/api/fields", paths);
        Assert.Contains("/api/fields/{field}/probe", paths);
        Assert.Contains("/tiles/{field}/{z}/{x}/{y}.png", paths);
    }
}
