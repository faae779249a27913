namespace Mosaic.Server.Api;

/// <summary>
/// The /sky answer: the view centre and its sky position, unit vectors in pixel axes (x right, y up) towards north
/// and east (null where the centre has no sky position), arcseconds per pixel at the centre, and the grid.
/// </summary>
public sealed record SkyDto(SkyCentreDto Centre, VectorDto? North, VectorDto? East, double? PixelScale, GridDto Grid);
