using System.Net;
using System.Text.Json;

namespace Mosaic.Server.Tests.Security;

/// <summary>
/// Paths that try to leave the data folder or the web root. RFC 3986 section 5.2.4 removes dot segments from a
/// request path, so a plain "/../" never reaches routing; encoded dots (%2e, RFC 3986 2.1), an encoded slash (%2F),
/// double encoding (%252e), backslashes, NUL and absolute forms do, and each must end at a 404 problem (RFC 9457)
/// without a byte of what lies outside. Symbolic links inside the data folder that point outside must not make fields.
/// </summary>
public sealed class PathConfinementTests(HostileDataFixture data) : IClassFixture<HostileDataFixture>
{
    public static TheoryData<string> EscapingTargets =>
    [
        // Field ids
        "/api/fields/..%2F..%2F..%2Fetc%2Fpasswd",
        "/api/fields/%2e%2e%2f%2e%2e%2foutside%2fsecret",
        "/api/fields/%2e%2e/%2e%2e/outside/secret",
        "/api/fields/%252e%252e%252f%252e%252e%252fetc%252fpasswd",
        "/api/fields/..%5c..%5coutside%5csecret",
        @"/api/fields/..\..\outside\secret",
        "/api/fields/%2Fetc%2Fpasswd",
        "/api/fields/open%2500",
        "/api/fields/..",
        "/api/fields/leak",
        "/api/fields/climb",
        "/api/fields/leakdir",
        "/api/fields/leakdir/probe?x=1&y=1",
        "/api/fields/../../outside/secret",
        // Band and HDU names
        "/api/fields/open/probe?band=..%2F..%2Foutside%2Fsecret&x=1&y=1",
        "/api/fields/open/probe?hdu=..%2F..%2Foutside%2Fsecret.fits&x=1&y=1",
        "/api/fields/cam/probe?band=x&x=1&y=1",
        "/api/fields/open/stats?band=%2Fetc%2Fpasswd",
        // Tiles
        "/tiles/leak/0/0/0.png",
        "/tiles/climb/0/0/0.png",
        "/tiles/..%2F..%2Foutside%2Fsecret/0/0/0.png",
        "/tiles/%2e%2e%2fleakdir/0/0/0.png",
        "/tiles/cam/0/0/0.png?band=x",
        // Saved views
        "/api/views/..%2F..%2F..%2Fetc%2Fpasswd",
        "/api/views/%2e%2e%2fviews.db",
        "/v/..%2F..%2Fviews.db",
        // The web root
        "/..%2F..%2F..%2Fetc%2Fpasswd",
        "/%2e%2e/%2e%2e/%2e%2e/etc/passwd",
        "/%252e%252e/%252e%252e/etc/passwd",
        "/lib/..%2F..%2FProgram.cs",
        @"/lib\..\..\Program.cs",
        "/../../../../etc/passwd",
        "//etc/passwd",
        "/etc/passwd",
        "/appsettings.json",
        "/Mosaic.Server.dll",
        // Absolute-form target (RFC 9112 section 3.2.2) naming a file path
        "http://127.0.0.1:{port}/../../etc/passwd",
        "http://127.0.0.1:{port}/api/fields/..%2F..%2Fetc%2Fpasswd",
    ];

    [Theory]
    [MemberData(nameof(EscapingTargets))]
    public async Task A_path_that_leaves_the_data_folder_or_the_web_root_is_a_404_problem(string target)
    {
        target = target.Replace("{port}", data.Port.ToString(System.Globalization.CultureInfo.InvariantCulture), StringComparison.Ordinal);
        var answer = await RawHttp.SendAsync(data.Port, target, headers: ["Accept: application/json"]);
        Assert.True(answer.Status == 404, $"{target} gave {answer.Status}: {answer.Body}");
        Assert.StartsWith("application/problem+json", answer.Headers.GetValueOrDefault("Content-Type") ?? "", StringComparison.Ordinal);
        using var problem = JsonDocument.Parse(answer.Body);
        Assert.Equal(404, problem.RootElement.GetProperty("status").GetInt32());
        Assert.DoesNotContain(HostileDataFixture.Secret, answer.Raw, StringComparison.Ordinal);
        Assert.DoesNotContain("root:", answer.Raw, StringComparison.Ordinal);
    }

    public static TheoryData<string> NulTargets => ["/api/fields/open%00.fits", "/index.html%00.png", "/tiles/open%00/0/0/0.png", "/api/views/%00"];

    [Theory]
    [MemberData(nameof(NulTargets))]
    public async Task A_NUL_in_the_path_is_refused_by_the_HTTP_parser_before_any_file_is_named(string target)
    {
        // Kestrel refuses a request target that decodes to a NUL with 400 and no body, before the application runs
        // (RFC 9112 section 3: a request line that cannot be parsed is a 400), so no endpoint or file provider sees it.
        var answer = await RawHttp.SendAsync(data.Port, target);
        Assert.Equal(400, answer.Status);
        Assert.Equal("", answer.Body);
        Assert.DoesNotContain(HostileDataFixture.Secret, answer.Raw, StringComparison.Ordinal);
    }

    public static TheoryData<string> Folders => ["/lib/", "/lib/leaflet/", "/lib/leaflet/images/", "/lib", "/tiles/", "/api/", "/tiles/open/"];

    [Theory]
    [MemberData(nameof(Folders))]
    public async Task No_folder_is_listed(string target)
    {
        var answer = await RawHttp.SendAsync(data.Port, target);
        // A listing would be 200 with the names of the folder's files (common practice for directory browsers).
        Assert.NotEqual(200, answer.Status);
        Assert.DoesNotContain("leaflet.css", answer.Body, StringComparison.Ordinal);
        Assert.DoesNotContain("marker-icon", answer.Body, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Links_pointing_out_of_the_data_folder_make_no_field_and_no_band()
    {
        using var list = JsonDocument.Parse(await data.Client.GetStringAsync("/api/fields"));
        var ids = list.RootElement.EnumerateArray().Select(f => f.GetProperty("id").GetString()).ToList();
        Assert.Equal(["cam", "open"], ids.Order(StringComparer.Ordinal));
        var cam = list.RootElement.EnumerateArray().Single(f => f.GetProperty("id").GetString() == "cam");
        Assert.Equal(["r"], cam.GetProperty("bands").EnumerateArray().Select(b => b.GetProperty("name").GetString()));
        Assert.DoesNotContain(HostileDataFixture.Secret, list.RootElement.GetRawText(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task The_honest_field_is_still_served_over_the_same_socket_path()
    {
        // The control: the raw client and the server agree on a plain request, so the 404s above are refusals.
        var answer = await RawHttp.SendAsync(data.Port, "/api/fields/open/probe?x=3&y=2");
        Assert.Equal(200, answer.Status);
        using var probe = JsonDocument.Parse(answer.Body);
        // open.fits holds 1 + x + 100 y at numpy [y, x] (0-based), so FITS (3, 2) is 1 + 2 + 100 = 103 (written by astropy above).
        Assert.Equal(103.0, probe.RootElement.GetProperty("value").GetDouble());
        Assert.Equal(HttpStatusCode.OK, (await data.Client.GetAsync("/index.html")).StatusCode);
    }
}
