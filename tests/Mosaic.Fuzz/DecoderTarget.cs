using System.Buffers.Binary;
using Mosaic.Fits.Compression;

namespace Mosaic.Fuzz;

/// <summary>
/// Feeds one codec stream straight to a decoder. Input: byte 0 picks the codec (RICE_1, GZIP, PLIO_1, HCOMPRESS_1),
/// byte 1 the tile width and byte 2 its height (1..64 each), byte 3 the RICE_1 BYTEPIX and BLOCKSIZE; the rest is the stream.
/// </summary>
public static class DecoderTarget
{
    private const int HeaderBytes = 4;

    public static void Run(Stream input)
    {
        using var memory = new MemoryStream();
        input.CopyTo(memory);
        var bytes = memory.ToArray();
        if (bytes.Length < HeaderBytes) return;
        var width = bytes[1] % 64 + 1;
        var height = bytes[2] % 64 + 1;
        var pixels = width * height;
        var stream = bytes.AsSpan(HeaderBytes);
        try
        {
            switch (bytes[0] % 4)
            {
                case 0:
                {
                    var bytePix = (bytes[3] & 3) switch { 0 => 1, 1 => 2, _ => 4 };
                    var blockSize = (bytes[3] >> 2) % 2 == 0 ? 32 : 16;
                    RiceDecoder.Decode(stream, blockSize, bytePix, new int[pixels]);
                    break;
                }
                case 1:
                    GzipInflater.Inflate(bytes[HeaderBytes..], bytes.Length - HeaderBytes, new byte[pixels * 2]);
                    break;
                case 2:
                {
                    var words = new short[stream.Length / 2];
                    for (var i = 0; i < words.Length; i++) words[i] = BinaryPrimitives.ReadInt16BigEndian(stream[(2 * i)..]);
                    PlioDecoder.Decode(words, new int[pixels]);
                    break;
                }
                default:
                    HCompressDecoder.Decode(stream, height, width, new long[pixels]);
                    break;
            }
        }
        catch (TileDataException)
        {
            // The decoders' typed rejection; the plane wraps it into a FitsFormatException naming file, HDU and tile.
        }
    }
}
