using System.Text.Json;
using Mosaic.Imaging.Encoding;
using Mosaic.Imaging.Tests.Display;

namespace Mosaic.Imaging.Tests.Encoding;

public sealed class Crc32Tests
{
    [Fact]
    public void Check_value_of_123456789_is_CBF43926()
    {
        // The published check value of CRC-32 (ISO-HDLC, as PNG and zlib use it) over the ASCII digits "123456789"
        // (from memory: the catalogue of parametrised CRC algorithms lists check=0xcbf43926).
        Assert.Equal(0xCBF43926u, Crc32.Compute("123456789"u8));
        Assert.Equal(0u, Crc32.Compute([]));
    }

    [Fact]
    public void Matches_pythons_zlib_crc32_at_every_length_and_in_pieces()
    {
        var rng = new Random(8);
        var data = new byte[100_003];
        rng.NextBytes(data);
        int[] lengths = [.. Enumerable.Range(0, 70), 1000, 4095, 65537, 100_003];
        using var folder = new TemporaryFolder();
        File.WriteAllBytes(folder.File("data.bin"), data);
        File.WriteAllText(folder.File("lengths.json"), JsonSerializer.Serialize(lengths));
        // Python's zlib module (Debian python3), an independent CRC-32 implementation.
        OutsideReference.Run("""
            import zlib
            d = open("data.bin", "rb").read()
            json.dump([zlib.crc32(d[:n]) for n in json.load(open("lengths.json"))], open("crc.json", "w"))
            """, folder.Path);
        var expected = JsonSerializer.Deserialize<uint[]>(File.ReadAllText(folder.File("crc.json")))!;
        for (var i = 0; i < lengths.Length; i++)
        {
            var piece = data.AsSpan(0, lengths[i]);
            Assert.Equal(expected[i], Crc32.Compute(piece));
            // Fed in uneven pieces through the running register.
            var register = Crc32.Start;
            for (var at = 0; at < piece.Length; at += 13) register = Crc32.Append(register, piece[at..Math.Min(piece.Length, at + 13)]);
            Assert.Equal(expected[i], Crc32.Finish(register));
        }
    }
}
