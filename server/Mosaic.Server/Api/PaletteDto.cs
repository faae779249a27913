namespace Mosaic.Server.Api;

/// <summary>A palette a viewer can pick: its URL name, a label, its 256 colours (rrggbb, t = i / 255) and its parameters.</summary>
public sealed record PaletteDto(string Name, string Label, IReadOnlyList<string> Colors, string DefaultMasked, IReadOnlyList<PaletteParameterDto> Parameters);
