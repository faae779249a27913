"""Reference values of tile-compressed files, from two outside readers.

Usage: compressed_reference.py FOLDER NAME... For each NAME it reads NAME.ref.fits (written by funpack, Debian
libcfitsio-bin) with astropy.io.fits and NAME.fz with astropy's CompImageHDU, and writes NAME.funpack.bin and
NAME.astropy.bin: the physical values (little-endian float64, row-major, NaN where undefined) computed from the
stored integers by FITS 4.0 section 4.4.2.5 (BZERO + BSCALE * stored, BLANK undefined). It prints a JSON object:
"headers", the restored header astropy gives each compressed HDU, and "zscale", the largest ZSCALE of each
quantised case. A NAME written as +NAME is read by funpack's output only
(astropy does not decode every codec, NOCOMPRESS for one).
"""
import json
import sys
import numpy as np
from astropy.io import fits

folder = sys.argv[1]


def physical(hdu):
    header = hdu.header
    data = np.asarray(hdu.data)
    bitpix = header["BITPIX"]
    if bitpix < 0:
        values = data.astype(np.float64)
        scale, zero = header.get("BSCALE", 1.0), header.get("BZERO", 0.0)
        return values if (scale, zero) == (1.0, 0.0) else zero + scale * values
    scale, zero = header.get("BSCALE", 1.0), header.get("BZERO", 0.0)
    values = zero + scale * data.astype(np.float64)
    if "BLANK" in header:
        values[data == header["BLANK"]] = np.nan
    return values


def first_image(hdus):
    return next(h for h in hdus if h.data is not None and h.header.get("NAXIS", 0) >= 2)


headers = {}
zscale = {}
for argument in sys.argv[2:]:
    name = argument.lstrip("+")
    with fits.open(f"{folder}/{name}.ref.fits", do_not_scale_image_data=True) as f:
        physical(first_image(f)).astype("<f8").tofile(f"{folder}/{name}.funpack.bin")
    with fits.open(f"{folder}/{name}.fz", disable_image_compression=True) as f:
        table = next(h for h in f if h.header.get("ZIMAGE"))
        if "ZSCALE" in table.columns.names:
            zscale[name] = float(np.max(table.data["ZSCALE"]))
    if argument.startswith("+"):
        continue
    with fits.open(f"{folder}/{name}.fz") as f:
        hdu = next(h for h in f if isinstance(h, fits.CompImageHDU))
        headers[name] = {c.keyword: c.value for c in hdu.header.cards if c.keyword not in ("COMMENT", "HISTORY", "")}
        if hdu.header["BITPIX"] < 0:
            # Floating point: astropy turns ZBLANK into NaN only when it undoes the quantisation itself.
            np.asarray(hdu.data, dtype=np.float64).astype("<f8").tofile(f"{folder}/{name}.astropy.bin")
            continue
    with fits.open(f"{folder}/{name}.fz", do_not_scale_image_data=True) as f:
        hdu = next(h for h in f if isinstance(h, fits.CompImageHDU))
        physical(hdu).astype("<f8").tofile(f"{folder}/{name}.astropy.bin")
print(json.dumps({"headers": headers, "zscale": zscale}, default=str))
