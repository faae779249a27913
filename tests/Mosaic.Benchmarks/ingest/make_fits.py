"""Synthetic float32 FITS for the ingest benchmark, written in row chunks so memory stays small.

  make_fits.py frame PATH SIZE          one SIZE x SIZE image in the primary HDU
  make_fits.py field PATH CHIPS SIZE    a multi-extension file of CHIPS chips of SIZE x SIZE, tiled on the sky
                                        (TAN WCS each, 4 chips a row, 0.2"/px, small gaps), FILTER = "x"

Pixels: Gaussian noise about 100 with a sprinkle of NaN; run under Debian's /usr/bin/python3 (python3-astropy, numpy).
"""
import sys
import numpy as np
from astropy.io import fits

BLOCK = 2880


def write_hdu(out, header, size, rng):
    out.write(header.tostring().encode("ascii"))
    rows = max(1, (1 << 24) // size)  # ~64 MiB of float32 per chunk
    for y in range(0, size, rows):
        n = min(rows, size - y)
        chunk = rng.normal(100.0, 5.0, size=(n, size)).astype(">f4")
        chunk[:, ::997] = np.nan
        out.write(chunk.tobytes())
    pad = (-size * size * 4) % BLOCK
    out.write(b"\0" * pad)


def image_header(size, primary, extra=()):
    h = fits.Header()
    if primary:
        h["SIMPLE"] = True
    else:
        h["XTENSION"] = "IMAGE"
    h["BITPIX"] = -32
    h["NAXIS"] = 2
    h["NAXIS1"] = size
    h["NAXIS2"] = size
    if primary:
        h["EXTEND"] = True
    else:
        h["PCOUNT"] = 0
        h["GCOUNT"] = 1
    for k, v in extra:
        h[k] = v
    return h


def main():
    kind, path = sys.argv[1], sys.argv[2]
    rng = np.random.default_rng(5)
    with open(path, "wb") as out:
        if kind == "frame":
            write_hdu(out, image_header(int(sys.argv[3]), True), int(sys.argv[3]), rng)
            return
        chips, size = int(sys.argv[3]), int(sys.argv[4])
        primary = fits.Header()
        primary["SIMPLE"] = True
        primary["BITPIX"] = 8
        primary["NAXIS"] = 0
        primary["EXTEND"] = True
        primary["FILTER"] = "x"
        out.write(primary.tostring().encode("ascii"))
        scale = 0.2 / 3600
        step = size * 1.01 * scale
        for k in range(chips):
            col, row = k % 4, k // 4
            wcs = [("EXTNAME", f"C{k + 1:02d}"), ("CTYPE1", "RA---TAN"), ("CTYPE2", "DEC--TAN"),
                   ("CRPIX1", (size + 1) / 2), ("CRPIX2", (size + 1) / 2),
                   ("CRVAL1", 40.0 - (col - 1.5) * step / np.cos(np.radians(20.0))), ("CRVAL2", 20.0 + (row - 1.5) * step),
                   ("CD1_1", -scale), ("CD1_2", 0.0), ("CD2_1", 0.0), ("CD2_2", scale), ("RADESYS", "ICRS")]
            write_hdu(out, image_header(size, False, wcs), size, rng)


main()
