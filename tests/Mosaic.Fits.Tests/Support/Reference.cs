using System.Globalization;
using System.Numerics;
using System.Text.Json;

namespace Mosaic.Fits.Tests.Support;

/// <summary>Readers for the JSON the reference scripts print (numbers travel as text so nothing is rounded on the way).</summary>
public static class Reference
{
    /// <summary>A Python float repr: digits, or "inf" / "-inf"; JSON null for NaN.</summary>
    public static double Real(JsonElement e) => e.ValueKind == JsonValueKind.Null ? double.NaN : e.GetString() switch
    {
        "inf" => double.PositiveInfinity,
        "-inf" => double.NegativeInfinity,
        var s => double.Parse(s!, NumberStyles.Float, CultureInfo.InvariantCulture),
    };

    public static double[] Reals(JsonElement array) => array.EnumerateArray().Select(Real).ToArray();

    /// <summary>Values that numpy already rounded to float32, so the narrowing here is exact.</summary>
    public static float[] Singles(JsonElement array) => array.EnumerateArray().Select(e => (float)Real(e)).ToArray();

    public static BigInteger Integer(JsonElement e) => BigInteger.Parse(e.GetString()!, CultureInfo.InvariantCulture);

    public static string? OptionalString(JsonElement parent, string name) =>
        parent.TryGetProperty(name, out var v) && v.ValueKind == JsonValueKind.String ? v.GetString() : null;

    /// <summary>Same value, treating every NaN as equal (FITS masks have no NaN payload meaning).</summary>
    public static bool SameSingle(float a, float b) =>
        (float.IsNaN(a) && float.IsNaN(b)) || BitConverter.SingleToInt32Bits(a) == BitConverter.SingleToInt32Bits(b);

    public static bool SameDouble(double a, double b) =>
        (double.IsNaN(a) && double.IsNaN(b)) || BitConverter.DoubleToInt64Bits(a) == BitConverter.DoubleToInt64Bits(b);
}
