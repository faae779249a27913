using System.Text.Json.Nodes;

namespace Mosaic.Server.Api;

/// <summary>A saved view with its state and the page link that opens it.</summary>
public sealed record ViewDto(string Id, string Url, string Field, string? Title, string? Note, DateTime Created, JsonObject State, string Link);
