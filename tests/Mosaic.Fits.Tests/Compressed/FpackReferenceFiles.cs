using System.Text.Json;
using Mosaic.Fits.Tests.Support;
using Mosaic.Testing;

namespace Mosaic.Fits.Tests.Compressed;

/// <summary>
/// Synthetic images (numpy + astropy.io.fits) packed by fpack and unpacked again by funpack (Debian libcfitsio-bin),
/// with the physical values of funpack's output and of astropy's CompImageHDU reading, as little-endian doubles.
/// </summary>
public sealed class FpackReferenceFiles : IDisposable
{
    public static readonly FpackCase[] Cases =
    [
        new("i16_rice", "i16", []),
        new("i16_rice_t16", "i16", ["-t", "16,16"]),
        new("i16_gzip1", "i16", ["-g1"]),
        new("i16_gzip2_t16", "i16", ["-g2", "-t", "16,16"]),
        new("i16_nocompress", "i16", ["-d"], AstropyReads: false),
        new("u16_rice", "u16", []),
        new("u16_gzip2", "u16", ["-g2"]),
        new("u8_rice", "u8", []),
        new("u8_gzip2_t16", "u8", ["-g2", "-t", "16,16"]),
        new("u8_plio", "u8", ["-p"]),
        new("mask16_plio", "mask16", ["-p"]),
        new("mask16_plio_t16", "mask16", ["-p", "-t", "16,16"]),
        new("i32_rice_t64", "i32", ["-t", "64,64"]),
        new("i32_gzip1", "i32", ["-g1"]),
        new("s32_rice", "s32", []),
        new("f32_dither1", "f32", ["-q", "4"]),
        new("f32_dither1_seed", "f32", ["-q9999", "4"]),
        new("f32_dither2", "f32", ["-qz", "4"]),
        new("f32_nodither", "f32", ["-q0", "4"]),
        new("f32_dither1_t64", "f32", ["-t", "64,64", "-q", "4"], FunpackReads: false),
        new("f32_gzip1_dither1", "f32", ["-g1", "-q", "4"]),
        new("f32_gzip2_dither1", "f32", ["-g2", "-q", "4"]),
        new("f32_gzip2_dither2_t64", "f32", ["-g2", "-t", "64,64", "-qz", "4"], FunpackReads: false),
        new("f64_dither2_t16", "f64", ["-t", "16,16", "-qz", "4"], FunpackReads: false),
        new("f32_lossless_gzip1", "f32", ["-g1", "-q", "0"]),
        new("f32_lossless_gzip2", "f32", ["-g2", "-q", "0"]),
        new("f64_dither1", "f64", ["-q", "4"]),
        new("f64_lossless_gzip2", "f64", ["-g2", "-q", "0"]),
    ];

    private readonly TempFolder _folder = new();

    public FpackReferenceFiles()
    {
        Support.Astropy.Run("make_compressed_sources.py", _folder.Path);
        foreach (var c in Cases)
        {
            Run("/usr/bin/fpack", [.. c.Arguments, "-O", PathOf(c.Name), _folder.File(c.Source + ".fits")]);
            Run("/usr/bin/funpack", ["-O", _folder.File(c.Name + ".ref.fits"), PathOf(c.Name)]);
        }
        Run("/usr/bin/fpack", ["-h", "-O", PathOf("hcompress"), _folder.File("i16.fits")]);
        var output = Support.Astropy.Run("compressed_reference.py", [_folder.Path, .. Cases.Select(c => c.AstropyReads ? c.Name : "+" + c.Name)]);
        Headers = JsonDocument.Parse(output);
    }

    /// <summary>"headers": the restored header astropy gives each compressed HDU; "zscale": the largest ZSCALE of each quantised case.</summary>
    public JsonDocument Headers { get; }

    public JsonElement HeaderOf(string name) => Headers.RootElement.GetProperty("headers").GetProperty(name);

    /// <summary>The largest ZSCALE of the case's tiles, as astropy reads the table; null where the case is not quantised.</summary>
    public double? LargestScale(string name) =>
        Headers.RootElement.GetProperty("zscale").TryGetProperty(name, out var v) ? v.GetDouble() : null;

    public string PathOf(string name) => _folder.File(name + ".fz");

    public string SourcePath(string source) => _folder.File(source + ".fits");

    public string FolderPath => _folder.Path;

    /// <summary>Physical values of funpack's output of the case, row-major from FITS y = 1.</summary>
    public double[] Funpack(string name) => Doubles(_folder.File(name + ".funpack.bin"));

    /// <summary>The best outside reference of the case: funpack's output, or astropy's where funpack's is not valid (see <see cref="FpackCase"/>).</summary>
    public double[] Reference(FpackCase c) => c.FunpackReads ? Funpack(c.Name) : AstropyCompressed(c.Name);

    /// <summary>
    /// astropy 5.2's CompImageHDU leaves pixels equal to the ZBLANK keyword as dequantised numbers instead of NaN
    /// (seen with these files; funpack does give NaN). Where the source pixel is NaN, astropy is no reference: the
    /// tests check those pixels against the source instead.
    /// </summary>
    public bool[] SourceNaN(FpackCase c)
    {
        using var source = FitsFile.Open(SourcePath(c.Source));
        var plane = source.Hdus.First(h => h.Image is not null).Image!;
        var values = new float[plane.Width * plane.Height];
        plane.ReadRows(0, plane.Height, values);
        return values.Select(float.IsNaN).ToArray();
    }

    public static FpackCase Case(string name) => Cases.Single(c => c.Name == name);

    /// <summary>Physical values astropy's CompImageHDU reads from the compressed file itself.</summary>
    public double[] AstropyCompressed(string name) => Doubles(_folder.File(name + ".astropy.bin"));

    /// <summary>funpack's output file (an uncompressed FITS file).</summary>
    public string UnpackedPath(string name) => _folder.File(name + ".ref.fits");

    private static double[] Doubles(string path)
    {
        var bytes = File.ReadAllBytes(path);
        var values = new double[bytes.Length / 8];
        for (var i = 0; i < values.Length; i++) values[i] = BitConverter.ToDouble(bytes, 8 * i);
        return values;
    }

    private static void Run(string program, string[] arguments)
    {
        if (!File.Exists(program))
            throw new InvalidOperationException($"{program} is missing: apt-get install libcfitsio-bin");
        var result = ExternalProgram.Run(program, arguments);
        if (result.ExitCode != 0)
            throw new InvalidOperationException($"{Path.GetFileName(program)} {string.Join(' ', arguments)} failed: {result.Stderr}{result.Stdout}");
    }

    public void Dispose()
    {
        Headers.Dispose();
        _folder.Dispose();
    }
}
