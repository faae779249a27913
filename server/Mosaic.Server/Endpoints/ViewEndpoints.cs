using System.ComponentModel;
using System.Net;
using System.Text.Json;
using System.Text.Json.Nodes;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.AspNetCore.Mvc;
using Mosaic.Server.Api;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Views;

namespace Mosaic.Server.Endpoints;

/// <summary>Saved views: create, read, list per field, delete with the key, and the short /v/{id} address.</summary>
public static class ViewEndpoints
{
    public const int MaxTitle = 200;
    public const int MaxNote = 4000;

    /// <summary>Room for a full state, a title and a note with JSON escapes; a longer body is refused unread.</summary>
    private const int MaxBodyBytes = 64 * 1024;

    private static readonly string[] BodyProperties = ["state", "title", "note"];

    public static RouteGroupBuilder MapViewEndpoints(this IEndpointRouteBuilder routes)
    {
        // Opened now, so a state folder that cannot hold the database stops the start rather than the first save.
        _ = routes.ServiceProvider.GetRequiredService<ViewStore>();
        var group = routes.MapGroup("/api/views").WithTags("Views");
        group.MapPost("/", Create)
            .Accepts<JsonObject>("application/json")
            .WithSummary("Saves a view: body {state: {parameter: value, ...}, title?, note?}. Answers 201 with id, url (/v/{id}) and the deleteKey, shown only here.");
        group.MapGet("/{id}", Get).WithSummary("A saved view: its state, title, note, creation time and the page link that opens it.");
        group.MapGet("/", List).WithSummary("The saved views of a field, newest first (at most 500), without their states.");
        group.MapDelete("/{id}", Delete).WithSummary("Deletes a saved view; needs the deleteKey given when it was saved, as ?key= or the X-Delete-Key header.");
        routes.MapGet("/v/{id}", Open).WithTags("Views").WithSummary("Redirects (302) to the page link of a saved view.");
        return group;
    }

    private static async Task<Created<ViewCreatedDto>> Create(HttpRequest request, ViewStore store, FieldCatalog catalog, CancellationToken cancellationToken)
    {
        using var body = await ReadBody(request, cancellationToken);
        var root = body.RootElement;
        if (root.ValueKind != JsonValueKind.Object)
            throw ViewState.Bad("body", $"The body must be a JSON object {{\"state\": {{...}}, \"title\": ..., \"note\": ...}}; got {ViewState.Kind(root)}.");
        foreach (var property in root.EnumerateObject())
            if (!BodyProperties.Contains(property.Name))
                throw ViewState.Bad(property.Name, $"'{property.Name}' is not part of a saved view; the body holds {string.Join(", ", BodyProperties)}.");
        if (!root.TryGetProperty("state", out var stateElement))
            throw ViewState.Bad("state", "'state' is required: the view's parameters as a JSON object of strings.");

        var state = ViewState.Parse(stateElement);
        var title = Text(root, "title", MaxTitle);
        var note = Text(root, "note", MaxNote);
        var field = ViewState.Value(state, "field")!;
        try
        {
            catalog.Get(field);
        }
        catch (MosaicRequestException e) when (e.Status == StatusCodes.Status404NotFound)
        {
            throw new MosaicRequestException(StatusCodes.Status422UnprocessableEntity, "Unknown field in 'state.field'",
                $"'state.field' names no field of this server: {e.Message}", "state.field");
        }

        var (view, key) = store.Add(field, title, note, state);
        return TypedResults.Created($"/api/views/{view.Id}", new ViewCreatedDto(view.Id, view.Url, key, view.Field, view.Title, view.Note, view.Created.UtcDateTime, State(view)));
    }

    private static Ok<ViewDto> Get(string id, ViewStore store)
    {
        var view = store.Find(id) ?? throw NotFound(id);
        return TypedResults.Ok(new ViewDto(view.Id, view.Url, view.Field, view.Title, view.Note, view.Created.UtcDateTime, State(view), view.Link));
    }

    private static Ok<ViewSummaryDto[]> List([Description("The field whose saved views to list (required).")] string? field, ViewStore store)
    {
        if (string.IsNullOrWhiteSpace(field)) throw MosaicRequestException.BadParameter("field", "'field' is required: the field whose saved views to list.");
        var views = store.ListByField(field.Trim());
        return TypedResults.Ok(views.Select(v => new ViewSummaryDto(v.Id, v.Url, v.Field, v.Title, v.Note, v.Created.UtcDateTime, v.Link)).ToArray());
    }

    private static NoContent Delete(string id,
        [Description("The deleteKey given when the view was saved (or send it as the X-Delete-Key header).")] string? key,
        [FromHeader(Name = "X-Delete-Key")] string? headerKey,
        ViewStore store)
    {
        var given = string.IsNullOrEmpty(key) ? headerKey : key;
        return store.Delete(id, given) switch
        {
            DeleteOutcome.Deleted => TypedResults.NoContent(),
            DeleteOutcome.NotFound => throw NotFound(id),
            _ => throw new MosaicRequestException(StatusCodes.Status403Forbidden, "Wrong delete key",
                string.IsNullOrEmpty(given)
                    ? $"Deleting view '{id}' needs its deleteKey, as ?key= or the X-Delete-Key header."
                    : $"The key given is not the deleteKey of view '{id}'.", "key"),
        };
    }

    private static Results<RedirectHttpResult, ContentHttpResult> Open(string id, HttpRequest request, ViewStore store)
    {
        if (store.Find(id) is { } view) return TypedResults.Redirect(view.Link);
        if (request.Headers.Accept.Any(a => a is not null && a.Contains("json", StringComparison.OrdinalIgnoreCase))) throw NotFound(id);
        var html = $"""
            <!DOCTYPE html>
            <html lang="en"><head><meta charset="utf-8"><title>No such saved view</title></head>
            <body><h1>No such saved view</h1><p>There is no saved view '{WebUtility.HtmlEncode(id)}': it may have been deleted, or the link is mistyped.</p>
            <p><a href="/">Open the viewer</a></p></body></html>
            """;
        return TypedResults.Content(html, "text/html; charset=utf-8", statusCode: StatusCodes.Status404NotFound);
    }

    private static async Task<JsonDocument> ReadBody(HttpRequest request, CancellationToken cancellationToken)
    {
        if (request.ContentLength > MaxBodyBytes) throw TooLarge();
        using var buffer = new MemoryStream();
        var chunk = new byte[8192];
        int n;
        while ((n = await request.Body.ReadAsync(chunk, cancellationToken)) > 0)
        {
            if (buffer.Length + n > MaxBodyBytes) throw TooLarge();
            buffer.Write(chunk, 0, n);
        }
        if (buffer.Length == 0) throw ViewState.Bad("body", "The body is empty; send {\"state\": {...}} as JSON.");
        try
        {
            return JsonDocument.Parse(buffer.ToArray());
        }
        catch (JsonException e)
        {
            throw ViewState.Bad("body", $"The body is not valid JSON: {e.Message}");
        }
    }

    private static MosaicRequestException TooLarge() =>
        new(StatusCodes.Status413PayloadTooLarge, "Body too large", $"A saved view's body is at most {MaxBodyBytes} bytes.", "body");

    private static string? Text(JsonElement root, string name, int max)
    {
        if (!root.TryGetProperty(name, out var element) || element.ValueKind == JsonValueKind.Null) return null;
        if (element.ValueKind != JsonValueKind.String)
            throw ViewState.Bad(name, $"'{name}' must be a string; got {ViewState.Kind(element)}.");
        var text = element.GetString()!;
        if (text.Length > max) throw ViewState.Bad(name, $"'{name}' is {text.Length} characters long; at most {max} are kept.");
        return text.Length == 0 ? null : text;
    }

    private static MosaicRequestException NotFound(string id) =>
        MosaicRequestException.NotFound("View", $"There is no saved view '{id}'.", "id");

    private static JsonObject State(SavedView view)
    {
        var state = new JsonObject();
        foreach (var (key, value) in view.State) state[key] = value;
        return state;
    }
}
