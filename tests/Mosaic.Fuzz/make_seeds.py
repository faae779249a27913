"""Seeds for fuzz.sh: a small synthetic image, fpack-ed with every codec, and the first tile stream of each.

Run by Debian's /usr/bin/python3 (python3-astropy, python3-numpy); fpack is Debian's libcfitsio-bin.
usage: make_seeds.py FILE_SEEDS DECODER_SEEDS
"""
import os
import subprocess
import sys

import numpy as np
from astropy.io import fits

file_dir, decoder_dir = sys.argv[1], sys.argv[2]
os.makedirs(file_dir, exist_ok=True)
os.makedirs(decoder_dir, exist_ok=True)

# A smooth ramp with a bump and a little deterministic noise: compressible, but not trivially.
y, x = np.mgrid[0:30, 0:40]
image = (100 + 3 * x + 2 * y + 50 * np.exp(-((x - 20) ** 2 + (y - 15) ** 2) / 30.0)).astype(np.int16)
image += (np.random.default_rng(7).integers(0, 4, image.shape)).astype(np.int16)
plain = os.path.join(file_dir, "plain.fits")
fits.PrimaryHDU(image).writeto(plain, overwrite=True)
fits.HDUList([fits.PrimaryHDU(), fits.ImageHDU((image // 8).astype(np.uint8), name="BYTES")]).writeto(
    os.path.join(file_dir, "two_hdus.fits"), overwrite=True)

# Codec switches of fpack, and the selector byte DecoderTarget gives each codec.
codecs = {"rice": (["-r"], 0), "gzip1": (["-g1"], 1), "plio": (["-p"], 2), "hcompress": (["-h"], 3)}
for name, (switches, selector) in codecs.items():
    packed = os.path.join(file_dir, f"{name}.fz")
    subprocess.run(["/usr/bin/fpack", *switches, "-t", "16,16", "-O", packed, plain], check=True)
    with fits.open(packed, disable_image_compression=True) as hdus:
        stream = bytes(np.asarray(hdus[1].data["COMPRESSED_DATA"][0]).tobytes())
    # The first tile is 16 x 16; RICE_1 of 16-bit pixels is BYTEPIX 2, BLOCKSIZE 32 (byte 3 = 1).
    head = bytes([selector, 15, 15, 1])
    with open(os.path.join(decoder_dir, f"{name}.bin"), "wb") as out:
        out.write(head + stream)
