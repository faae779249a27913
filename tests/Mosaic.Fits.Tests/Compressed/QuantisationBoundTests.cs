namespace Mosaic.Fits.Tests.Compressed;

/// <summary>
/// The decoded image against the source image fpack was given: lossless cases give every value back exactly, and
/// quantised floats stay within half a quantisation step (ZSCALE / 2) of the source, NaN exactly where the source is
/// NaN (FITS 4.0 section 10.2), and under SUBTRACTIVE_DITHER_2 exact zeros stay exactly zero (section 10.2.1).
/// </summary>
[Collection(FpackCollection.Name)]
public sealed class QuantisationBoundTests(FpackReferenceFiles files)
{
    public static TheoryData<string> CaseNames() => DecodedPixelTests.CaseNames();

    [Theory]
    [MemberData(nameof(CaseNames))]
    public void DecodedValuesAreTheSourceWithinTheQuantisationStep(string name)
    {
        var c = FpackReferenceFiles.Case(name);
        var (file, plane) = DecodedPixelTests.Open(files.PathOf(name));
        using var source = FitsFile.Open(files.SourcePath(c.Source));
        using (file)
        {
            var original = source.Hdus.First(h => h.Image is not null).Image!;
            var step = files.LargestScale(name);
            var keepsZero = c.Arguments.Contains("-qz");
            for (var y = 0; y < plane.Height; y++)
                for (var x = 0; x < plane.Width; x++)
                {
                    var want = original.ReadValue(x, y);
                    var got = plane.ReadValue(x, y);
                    var ok = double.IsNaN(want) ? double.IsNaN(got)
                        : step is null || (keepsZero && want == 0) ? want.Equals(got)
                        // Half a step, plus the rounding of the value to single precision (common practice: 2^-23 relative).
                        : Math.Abs(got - want) <= step.Value / 2 + Math.Abs(want) * 1.2e-7;
                    if (!ok) Assert.Fail($"{name} ({x + 1}, {y + 1}): source {want:R}, read {got:R}");
                }
        }
    }
}
