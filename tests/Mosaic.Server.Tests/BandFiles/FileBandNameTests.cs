using Mosaic.Server.Fields;

namespace Mosaic.Server.Tests.BandFiles;

/// <summary>The file-name rule for files without FILTER, on the examples the README documents (and their edges).</summary>
public sealed class FileBandNameTests
{
    [Theory]
    [InlineData("deep_r.fits", "deep", "r")]         // README: folder name and separator off the front
    [InlineData("c01_r.fits", "cam", "r")]           // README: the text after the last separator
    [InlineData("c02-r.fits.fz", "cam", "r")]        // README: '-' is a separator; .fits.fz both come off
    [InlineData("red.fits", "deep", "red")]          // README: no separator, the whole stem
    [InlineData("deep.fits", "deep", "deep")]        // nothing would be left after the folder name: kept whole
    [InlineData("run.2_g_v3.fit", "run", "v3")]      // "run." off the front, then after the last separator
    [InlineData("c01_.fits", "cam", "c01_")]         // nothing after the last separator: the whole stem
    [InlineData("deep_r.fits", null, "deep_r")]      // a file that is a field of its own: its stem
    public void A_file_without_FILTER_gets_the_band_the_documented_rule_gives(string file, string? folder, string band) =>
        Assert.Equal(band, FieldNaming.FileBandName(file, folder));

    [Fact]
    public void FILTER_wins_over_the_file_name_the_HDUs_own_over_the_primarys_and_is_kept_as_written()
    {
        Assert.Equal("r'", FieldNaming.BandName("  r'  ", "g", "c01_x.fits", "cam"));
        Assert.Equal("g", FieldNaming.BandName("   ", "g", "c01_x.fits", "cam"));
        Assert.Equal("x", FieldNaming.BandName(null, null, "c01_x.fits", "cam"));
    }
}
