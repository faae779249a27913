namespace Mosaic.Imaging.Encoding;

/// <summary>How the PNG image data is deflated.</summary>
public enum PngCompression
{
    /// <summary>
    /// Huffman coding only, by our own deflater (one dynamic code per block of rows, codes of at most 14 bits): the
    /// same kind of stream as <see cref="ZlibHuffmanOnly"/> without zlib's set-up, within 1 % of its size and faster
    /// on the sky tile (PngEncodeBenchmarks).
    /// </summary>
    HuffmanOnly,

    /// <summary>
    /// zlib level 1, Huffman coding only: on noisy sky the LZ77 match search finds little, so skipping it is the
    /// fastest, and its dynamic codes still reach about the noise's entropy (measured: 68% of raw on a sigma-10 tile).
    /// </summary>
    ZlibHuffmanOnly,

    /// <summary>zlib level 1 with its default strategy (LZ77 matches; zlib-ng's quick mode uses static codes, so noise barely shrinks: 99% of raw).</summary>
    Fastest,

    /// <summary>Stored deflate blocks: no compression, for measuring the container alone.</summary>
    Stored,
}
