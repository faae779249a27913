using System.Text.Json;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>A chip the whole field leaves off, and the server's reason.</summary>
public sealed record ExcludedChipInfo(int Hdu, string Name, string Reason)
{
    public static ExcludedChipInfo Parse(JsonElement chip) => new(
        chip.GetProperty("hdu").GetInt32(),
        chip.GetProperty("name").GetString()!,
        chip.GetProperty("reason").GetString()!);
}
