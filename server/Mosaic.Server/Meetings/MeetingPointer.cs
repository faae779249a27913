namespace Mosaic.Server.Meetings;

/// <summary>Where the presenter points: FITS pixel position (1-based) on the presenter's current band and HDU.</summary>
public sealed record MeetingPointer(double X, double Y);
