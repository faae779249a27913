"""Writes small synthetic uncompressed images (numpy + astropy.io.fits) for the tile-compression tests to pack with fpack.

Usage: make_compressed_sources.py FOLDER. Odd sizes, so tiles of 16 and 64 leave partial tiles at the edges.
"""
import sys
import numpy as np
from astropy.io import fits

folder = sys.argv[1]
rng = np.random.default_rng(20261201)


def write(name, data, extension=False, **cards):
    hdu = fits.ImageHDU(data) if extension else fits.PrimaryHDU(data)
    for key, value in cards.items():
        hdu.header[key] = value
    hdus = [fits.PrimaryHDU(), hdu] if extension else [hdu]
    fits.HDUList(hdus).writeto(f"{folder}/{name}.fits", overwrite=True)


def sky(shape, level, sigma):
    y, x = np.mgrid[0:shape[0], 0:shape[1]]
    blob = 400.0 * np.exp(-((x - shape[1] * 0.6) ** 2 + (y - shape[0] * 0.4) ** 2) / 30.0)
    return rng.normal(level, sigma, shape) + blob


# 16-bit signed with BLANK pixels, in an extension with its own name and a user keyword.
i16 = np.round(sky((37, 53), 1200, 40)).astype(np.int16)
i16[4, 7] = -32768
i16[30, 52] = -32768
write("i16", i16, extension=True, EXTNAME="CHIP07", BLANK=-32768, OBSLABEL="synthetic field 3")

# 16-bit unsigned (BZERO = 32768, FITS 4.0 section 5.3): stored values are signed.
u16 = np.clip(np.round(sky((41, 67), 40000, 900)), 0, 65535).astype(np.uint16)
fits.PrimaryHDU(u16).writeto(f"{folder}/u16.fits", overwrite=True)

# 8-bit unsigned covering the whole range.
u8 = rng.integers(0, 256, (29, 45)).astype(np.uint8)
u8[0, :10] = 255
u8[1, :10] = 0
write("u8", u8)

# Non-negative 16-bit mask-like image with long runs (PLIO_1 takes values 0 .. 2^24 - 1).
mask16 = np.zeros((43, 77), dtype=np.int16)
mask16[5:20, 10:60] = 3
mask16[22:30, :] = 4095
mask16[31, 5] = 4096
mask16[32:40, 30:35] = rng.integers(0, 32767, (8, 5)).astype(np.int16)
mask16[42, 76] = 1
write("mask16", mask16)

# 32-bit signed, full range, larger so 64 x 64 tiles are partial on both edges.
i32 = rng.integers(-2**31, 2**31 - 1, (97, 150), dtype=np.int64).astype(np.int32)
i32[10:20, 10:30] = np.round(sky((10, 20), 5, 2)).astype(np.int32)
write("i32", i32, BSCALE=1.0, BZERO=0.0)

# 32-bit with a non-trivial BSCALE/BZERO and BLANK.
s32 = np.round(sky((33, 40), 5000, 100)).astype(np.int32)
s32[3, 3] = -999
write("s32", s32, BSCALE=0.25, BZERO=-100.0, BLANK=-999)

# 32-bit float with NaN, exact zeros, a constant row (cannot be quantised) and a bright source.
f32 = sky((97, 150), 100.0, 5.0).astype(np.float32)
f32[5, 5] = np.nan
f32[50, 20:40] = np.nan
f32[60, :] = 0.0
f32[61, :] = 7.25
f32[70:72, 100:110] = 0.0
write("f32", f32, BUNIT="count")

# 64-bit float.
f64 = sky((45, 71), -3.0, 0.5)
f64[2, 2] = np.nan
write("f64", f64)
