using System.Net;
using System.Text;
using System.Text.Json;

namespace Mosaic.Server.Tests.Security;

/// <summary>
/// Every endpoint with bad values of each of its parameters: each gives 400 with RFC 9457 problem details whose
/// 'parameter' member and detail name the parameter. Numbers must be finite (IEEE 754 NaN, infinities and 1e999, which
/// overflows binary64 to infinity, are refused), limits ordered (lo &lt; hi), percentiles within [0, 100], softening and
/// exponents positive, names from the known lists, values of bounded length and each parameter given once.
/// </summary>
public sealed class ParameterValidationTests(GenerousLimitsFixture data) : IClassFixture<GenerousLimitsFixture>
{
    private const string Render = "/api/fields/open/render.png?x0=1&y0=1&x1=4&y1=4&";
    private const string Tile = "/tiles/open/0/0/0.png?";
    private const string Display = "/api/fields/open/display?";
    private const string Stats = "/api/fields/open/stats?";
    private const string Histogram = "/api/fields/open/histogram?";
    private const string Probe = "/api/fields/open/probe?";
    private const string Sky = "/api/fields/open/sky?x0=1&y0=1&x1=40&y1=30&width=400&height=300&";
    private const string SkyBare = "/api/fields/open/sky?";
    private const string Cutout = "/api/fields/open/cutout.fits?";

    private static readonly string Long = new('a', 3000);

    /// <summary>Display parameters, shared by tiles, render.png and the display endpoint.</summary>
    private static readonly (string Query, string Parameter)[] DisplayCases =
    [
        ("lo=NaN&hi=5", "lo"),
        ("lo=Infinity&hi=5", "lo"),
        ("lo=1e999&hi=5", "lo"),
        ("lo=1&hi=-Infinity", "hi"),
        ("lo=0x10&hi=50", "lo"),
        ("lo=5&hi=1", "hi"),
        ("lo=5&hi=5", "hi"),
        ("limits=value&lo=1", "hi"),
        ("limits=sometimes", "limits"),
        ("plo=-1", "plo"),
        ("phi=100.5", "phi"),
        ("plo=60&phi=40", "phi"),
        ("plo=NaN", "plo"),
        ("klo=-1", "klo"),
        ("khi=0", "khi"),
        ("lo=1&hi=2&plo=5", "plo"),
        ("stretch=wavy", "stretch"),
        ("stretch=power&gamma=0", "gamma"),
        ("stretch=log&a=-1", "a"),
        ("stretch=asinh&soft=0", "soft"),
        ("stretch=asinh&soft=-2", "soft"),
        ("stretch=asinh&soft=Infinity", "soft"),
        ("stretch=asinh&pivot=middle", "pivot"),
        ("palette=rainbowish", "palette"),
        ("palette=cubehelix&ch-gamma=0", "ch-gamma"),
        ("palette=cubehelix&ch-start=7", "ch-start"),
        ("palette=cubehelix&ch-rot=1e999", "ch-rot"),
        ("masked=not-a-colour", "masked"),
        ("stretch=linear&stretch=log", "stretch"),
        ("lo=1&lo=2&hi=3", "lo"),
        ($"band={Long}", "band"),
        ($"palette={Long}", "palette"),
        ("band=open%00", "band"),
        ("rgb=sideways", "rgb"),
        ("rgb=lupton&red=open&blue=open", "green"),
        ("rgb=lupton&red=open&green=open&blue=open&q=0", "q"),
        ("rgb=lupton&red=open&green=open&blue=open&range=-1", "range"),
        ("rgb=lupton&red=open&green=open&blue=open&scale=1,2", "scale"),
        ("rgb=each&red=open&green=open&blue=open&red-gamma=0&red-stretch=power", "red-gamma"),
        ("rgb=each&red=open&green=open&blue=open&blue-colour=1", "blue-colour"),
    ];

    private static readonly (string Url, string Parameter)[] OtherCases =
    [
        // render.png: the box (FITS 1-based, inclusive, inside the 40 x 30 image)
        ("/api/fields/open/render.png?y0=1&x1=4&y1=4", "x0"),
        ("/api/fields/open/render.png?x0=abc&y0=1&x1=4&y1=4", "x0"),
        ("/api/fields/open/render.png?x0=0&y0=1&x1=4&y1=4", "x0"),
        ("/api/fields/open/render.png?x0=1.5&y0=1&x1=4&y1=4", "x0"),
        ("/api/fields/open/render.png?x0=99999999999&y0=1&x1=4&y1=4", "x0"),
        ("/api/fields/open/render.png?x0=1&y0=1&x1=41&y1=4", "x1"),
        ("/api/fields/open/render.png?x0=1&y0=1&x1=4&y1=31", "y1"),
        ("/api/fields/open/render.png?x0=5&y0=1&x1=4&y1=4", "x1"),
        ("/api/fields/open/render.png?x0=1&y0=9&x1=4&y1=4", "y1"),
        ("/api/fields/open/render.png?x0=1&y0=1&x1=4&y1=4&hdu=1&hdu=0", "hdu"),
        // Statistics of a box
        (Stats + "x0=NaN&y0=1&x1=4&y1=4", "x0"),
        (Stats + "x0=1&y0=1&x1=4", "y1"),
        (Stats + "x0=1&y0=5&x1=4&y1=4", "y1"),
        (Stats + "x0=1&y0=1&x1=400&y1=4", "x1"),
        (Stats + "x0=-3&y0=1&x1=4&y1=4", "x0"),
        // Histograms
        (Histogram + "bins=0", "bins"),
        (Histogram + "bins=5000", "bins"),
        (Histogram + "bins=twelve", "bins"),
        (Histogram + "lo=5&hi=1", "hi"),
        (Histogram + "lo=NaN&hi=1", "lo"),
        (Histogram + "lo=0&hi=1e999", "hi"),
        (Histogram + "scale=cubic", "scale"),
        (Histogram + "scale=log&lo=-1&hi=5", "lo"),
        // Probe
        (Probe + "x=NaN&y=1", "x"),
        (Probe + "x=1e999&y=1", "x"),
        (Probe + "x=1&y=-Infinity", "y"),
        (Probe + "x=0&y=1", "x"),
        (Probe + "x=1&y=31", "y"),
        (Probe + "x=1", "y"),
        (Probe + "ra=400&dec=0", "ra"),
        (Probe + "ra=150&dec=-91", "dec"),
        (Probe + "ra=150", "dec"),
        (Probe + "ra=NaN&dec=2", "ra"),
        (Probe + "position=somewhere%20nice", "position"),
        (Probe + "x=1&y=1&ra=150", "ra"),
        (Probe + "ra=150&dec=2&position=150%202", "position"),
        (Probe + $"position={Long}", "position"),
        // Sky
        (Sky.Replace("width=400", "width=0", StringComparison.Ordinal), "width"),
        (Sky.Replace("width=400", "width=1000000", StringComparison.Ordinal), "width"),
        (Sky.Replace("height=300", "height=NaN", StringComparison.Ordinal), "height"),
        (SkyBare + "x0=1&y0=1&x1=40&y1=30&width=400", "height"),
        (SkyBare + "x0=10&y0=1&x1=5&y1=30&width=400&height=300", "x1"),
        (SkyBare + "x0=-1e9&y0=1&x1=5&y1=30&width=400&height=300", "x0"),
        (SkyBare + "x0=1&y0=1&x1=40&y1=1e999&width=400&height=300", "y1"),
        // Cutouts
        (Cutout, "x0"),
        (Cutout + "ra=150&dec=2", "size"),
        (Cutout + "ra=150&dec=2&size=-1", "size"),
        (Cutout + "ra=150&dec=2&size=NaN", "size"),
        (Cutout + "ra=150&dec=2&size=1,2,3", "size"),
        (Cutout + "ra=150&dec=2&size=1e999", "size"),
        (Cutout + "ra=1000&dec=2&size=5", "ra"),
        (Cutout + "x0=1&y0=1&x1=4&y1=4&ra=150", "ra"),
        (Cutout + "x0=1&y0=1&x1=4&y1=4&size=5", "size"),
        (Cutout + "x0=1&y0=1&x1=4&y1=0", "y1"),
        // Saved views
        ("/api/views", "field"),
        ("/api/views?field=%20", "field"),
        ($"/api/views?field={Long}", "field"),
        ("/api/views?field=open&field=cam", "field"),
    ];

    public static TheoryData<string, string> Cases()
    {
        var cases = new TheoryData<string, string>();
        foreach (var prefix in new[] { Tile, Render, Display })
            foreach (var (query, parameter) in DisplayCases)
                cases.Add(prefix + query, parameter);
        foreach (var (url, parameter) in OtherCases) cases.Add(url, parameter);
        return cases;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public async Task A_bad_value_is_a_400_problem_naming_its_parameter(string url, string parameter)
    {
        using var response = await data.Client.GetAsync(url);
        await AssertNamesAsync(response, parameter, url);
    }

    public static TheoryData<string, string, string> Bodies => new()
    {
        { "/api/views", "[]", "body" },
        { "/api/views", "{\"state\": 5}", "state" },
        { "/api/views", "{\"state\": {\"field\": \"open\"}, \"colour\": 1}", "colour" },
        { "/api/views", $"{{\"state\": {{\"field\": \"open\"}}, \"title\": \"{new string('t', 201)}\"}}", "title" },
        { "/api/views", $"{{\"state\": {{\"field\": \"open\"}}, \"note\": 12}}", "note" },
        { "/api/meetings", "[]", "state" },
    };

    [Theory]
    [MemberData(nameof(Bodies))]
    public async Task A_bad_body_is_a_400_problem_naming_the_member(string url, string body, string parameter)
    {
        using var content = new StringContent(body, Encoding.UTF8, "application/json");
        using var response = await data.Client.PostAsync(url, content);
        await AssertNamesAsync(response, parameter, $"{url} {body}");
    }

    [Fact]
    public async Task Good_values_of_the_same_endpoints_pass_so_the_refusals_are_about_the_values()
    {
        // The control for the table: the same endpoints with sound values answer 200 (or 503 while a pyramid is built).
        foreach (var url in new[] { Display + "lo=1&hi=5", Probe + "x=1&y=1", Sky, Histogram + "lo=0&hi=5000&bins=10", Stats + "x0=1&y0=1&x1=4&y1=4" })
        {
            using var response = await data.Client.GetAsync(url);
            Assert.True(response.StatusCode is HttpStatusCode.OK or HttpStatusCode.ServiceUnavailable, $"{url} gave {(int)response.StatusCode}: {await response.Content.ReadAsStringAsync()}");
        }
    }

    private static async Task AssertNamesAsync(HttpResponseMessage response, string parameter, string what)
    {
        var text = await response.Content.ReadAsStringAsync();
        Assert.True(response.StatusCode == HttpStatusCode.BadRequest, $"{what} gave {(int)response.StatusCode}: {text}");
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        using var problem = JsonDocument.Parse(text);
        var root = problem.RootElement;
        Assert.Equal(400, root.GetProperty("status").GetInt32());
        Assert.True(root.TryGetProperty("parameter", out var named), $"{what}: no 'parameter' in {text}");
        Assert.Equal(parameter, named.GetString());
        Assert.Contains(parameter, root.GetProperty("detail").GetString(), StringComparison.Ordinal);
    }
}
