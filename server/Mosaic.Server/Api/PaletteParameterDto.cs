namespace Mosaic.Server.Api;

/// <summary>A palette parameter: its query-parameter name, a label, its allowed range (inclusive; Min excluded where MinExclusive) and default.</summary>
public sealed record PaletteParameterDto(string Name, string Label, double Min, double Max, bool MinExclusive, double Default);
