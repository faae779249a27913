using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests;

/// <summary>Angle comparisons and problem-details checks shared by the sky tests.</summary>
internal static class SkyAssert
{
    /// <summary>One milliarcsecond in degrees.</summary>
    public const double Milliarcsecond = 1.0 / 3600_000;

    /// <summary>RA difference folded into [-180, 180).</summary>
    public static double RaDifference(double a, double b)
    {
        var d = (a - b) % 360;
        if (d >= 180) d -= 360;
        if (d < -180) d += 360;
        return d;
    }

    /// <summary>Equal sky positions within <paramref name="toleranceDegrees"/>, the RA offset measured on the sky.</summary>
    public static void SamePosition(double raExpected, double decExpected, double raActual, double decActual, double toleranceDegrees, string what)
    {
        var dRa = RaDifference(raActual, raExpected) * Math.Cos(decExpected * Math.PI / 180);
        var dDec = decActual - decExpected;
        Assert.True(Math.Abs(dRa) <= toleranceDegrees && Math.Abs(dDec) <= toleranceDegrees,
            $"{what}: expected ({raExpected:R}, {decExpected:R}), got ({raActual:R}, {decActual:R}); offsets {dRa * 3.6e6:0.###} mas, {dDec * 3.6e6:0.###} mas");
    }

    public static async Task<JsonElement> Problem(HttpClient client, string url, HttpStatusCode status, string? parameter)
    {
        var response = await client.GetAsync(url);
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(status == response.StatusCode, $"{url}: expected {(int)status}, got {(int)response.StatusCode}: {body}");
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = JsonDocument.Parse(body).RootElement.Clone();
        Assert.Equal((int)status, problem.GetProperty("status").GetInt32());
        if (parameter is not null) Assert.Equal(parameter, problem.GetProperty("parameter").GetString());
        Assert.False(string.IsNullOrWhiteSpace(problem.GetProperty("detail").GetString()));
        return problem;
    }

    public static async Task<JsonElement> Get(HttpClient client, string url)
    {
        var response = await client.GetAsync(url);
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(response.StatusCode == HttpStatusCode.OK, $"{url}: {(int)response.StatusCode} {body}");
        return JsonDocument.Parse(body).RootElement.Clone();
    }
}
