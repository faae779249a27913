using System.Text.Json.Nodes;

namespace Mosaic.Server.Api;

/// <summary>A view just saved: the only answer that carries its delete key.</summary>
public sealed record ViewCreatedDto(string Id, string Url, string DeleteKey, string Field, string? Title, string? Note, DateTime Created, JsonObject State);
