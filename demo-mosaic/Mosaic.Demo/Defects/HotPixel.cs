namespace Mosaic.Demo.Defects;

/// <summary>A pixel with a dark current far above its neighbours: extra electrons in every exposure. 0-based.</summary>
public readonly record struct HotPixel(int X, int Y, double ExtraElectrons);
