using System.Text.Json;

namespace Mosaic.Server.Meetings;

/// <summary>Reads the presenter's pointer: null (it left the image) or {x, y}, finite FITS pixel coordinates.</summary>
public static class MeetingPointerReader
{
    // Far past any image this server can hold; keeps nonsense off the wire.
    private const double Bound = 1e9;

    public static MeetingPointer? Read(JsonElement pointer)
    {
        if (pointer.ValueKind is JsonValueKind.Null or JsonValueKind.Undefined) return null;
        if (pointer.ValueKind != JsonValueKind.Object)
            throw new MeetingException(MeetingError.BadInput, "'pointer' must be null or an object {x, y} of FITS pixel coordinates.", "pointer");
        return new MeetingPointer(Coordinate(pointer, "x"), Coordinate(pointer, "y"));
    }

    private static double Coordinate(JsonElement pointer, string name)
    {
        if (pointer.TryGetProperty(name, out var value) && value.ValueKind == JsonValueKind.Number
            && value.TryGetDouble(out var number) && double.IsFinite(number) && Math.Abs(number) <= Bound)
            return number;
        throw new MeetingException(MeetingError.BadInput, $"'pointer.{name}' must be a finite number of FITS pixels.", $"pointer.{name}");
    }
}
