namespace Mosaic.Demo.Defects;

/// <summary>
/// A column that is bad from <see cref="StartRow"/> to the top of the chip (0-based), as behind a charge trap: either
/// dead (keeps a small fraction of its signal) or hot (extra electrons in every pixel).
/// </summary>
public readonly record struct BadColumn(int X, int StartRow, bool Dead, double ExtraElectrons, double Response);
