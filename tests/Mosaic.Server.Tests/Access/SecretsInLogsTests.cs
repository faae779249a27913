using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Microsoft.AspNetCore.SignalR;
using Microsoft.AspNetCore.SignalR.Client;

namespace Mosaic.Server.Tests.Access;

/// <summary>Tokens, share tokens, presenter keys, hand-over codes and delete keys never reach the log, at any level.</summary>
public sealed class SecretsInLogsTests(AccessFixture fixture) : IClassFixture<AccessFixture>
{
    [Fact]
    public async Task Using_every_kind_of_secret_leaves_none_of_them_in_the_log()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        var secrets = new List<string> { AccessFixture.Token };

        using var holder = factory.WithBearer(AccessFixture.Token);
        using (var signIn = await factory.Browser().GetAsync($"/api/fields?field=open&token={AccessFixture.Token}"))
            Assert.Equal(HttpStatusCode.SeeOther, signIn.StatusCode);

        using var made = await holder.PostAsJsonAsync("/api/fields/open/share-tokens", new { lifetimeSeconds = 600 });
        var share = JsonDocument.Parse(await made.Content.ReadAsStringAsync()).RootElement.GetProperty("token").GetString()!;
        secrets.Add(share);
        using (var byHeader = await factory.WithBearer(share).GetAsync("/api/fields/open")) Assert.Equal(HttpStatusCode.OK, byHeader.StatusCode);
        using (var byAddress = await factory.Browser().GetAsync($"/api/fields/open?token={share}")) Assert.Equal(HttpStatusCode.SeeOther, byAddress.StatusCode);
        using (var tampered = await factory.WithBearer(share + "A").GetAsync("/api/fields/open")) Assert.Equal(HttpStatusCode.Unauthorized, tampered.StatusCode);

        using var saved = await holder.PostAsJsonAsync("/api/views", new { state = new Dictionary<string, string> { ["field"] = "open" } });
        var view = JsonDocument.Parse(await saved.Content.ReadAsStringAsync()).RootElement;
        var deleteKey = view.GetProperty("deleteKey").GetString()!;
        secrets.Add(deleteKey);
        using (var wrongKey = await holder.DeleteAsync($"/api/views/{view.GetProperty("id").GetString()}?key={deleteKey}x")) Assert.Equal(HttpStatusCode.Forbidden, wrongKey.StatusCode);
        using (var deleted = await holder.DeleteAsync($"/api/views/{view.GetProperty("id").GetString()}?key={deleteKey}")) Assert.Equal(HttpStatusCode.NoContent, deleted.StatusCode);

        using var started = await holder.PostAsJsonAsync("/api/meetings", new { state = new Dictionary<string, string> { ["field"] = "open", ["z"] = "1" } });
        var meeting = JsonDocument.Parse(await started.Content.ReadAsStringAsync()).RootElement;
        var id = meeting.GetProperty("id").GetString()!;
        var presenterKey = meeting.GetProperty("presenterKey").GetString()!;
        secrets.Add(presenterKey);
        await using (var presenter = await factory.ConnectAsync("http://localhost", AccessFixture.Token))
        {
            await presenter.InvokeAsync<Dictionary<string, string>>("Join", id);
            await presenter.InvokeAsync("Present", id, presenterKey, new Dictionary<string, string> { ["field"] = "open", ["z"] = "2" });
            var code = await presenter.InvokeAsync<string>("HandOver", id, presenterKey);
            secrets.Add(code);
            var newKey = await presenter.InvokeAsync<string>("TakeOver", id, code);
            secrets.Add(newKey);
            await Assert.ThrowsAsync<HubException>(() => presenter.InvokeAsync("Present", id, presenterKey, new Dictionary<string, string> { ["field"] = "open" }));
            await presenter.InvokeAsync("End", id, newKey);
        }

        var log = factory.Log.Lines;
        // The capture works and saw the requests: the redacted request lines are there.
        Assert.Contains(log, l => l.Contains("/api/fields?field=open&token=***", StringComparison.Ordinal));
        Assert.Contains(log, l => l.Contains("key=***", StringComparison.Ordinal));
        foreach (var secret in secrets)
        {
            var leaks = log.Where(l => l.Contains(secret, StringComparison.Ordinal)).ToList();
            Assert.True(leaks.Count == 0, $"a secret of {secret.Length} characters is in the log:\n{string.Join('\n', leaks.Take(3))}");
        }
    }
}
