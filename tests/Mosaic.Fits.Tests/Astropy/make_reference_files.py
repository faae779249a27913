"""Writes FITS test files with astropy.io.fits and a JSON of what astropy reads back from them.

Usage: make_reference_files.py OUTPUT_FOLDER
"""
import json
import os
import sys

import numpy as np
from astropy.io import fits

import fits_dump

out = sys.argv[1]
files = {}
rng = np.random.default_rng(20240611)
# Odd sizes so the vector loops and their scalar tails both run; width != height to catch transposition.
W, H = 67, 13


def save(name, hdul):
    path = os.path.join(out, name)
    hdul.writeto(path, overwrite=True)
    files[name] = fits_dump.file_json(path)


def ints(dtype):
    info = np.iinfo(dtype)
    a = rng.integers(info.min, info.max, size=(H, W), dtype=dtype, endpoint=True)
    a.flat[0] = info.min
    a.flat[1] = info.max
    a.flat[2] = 0
    return a


def primary_raw(data, cards):
    """Stored values and scaling keywords exactly as given (no rescaling by astropy)."""
    hdu = fits.PrimaryHDU(data=data, do_not_scale_image_data=True)
    for k, v in cards:
        hdu.header[k] = v
    return fits.HDUList([hdu])


# One file per BITPIX, unscaled.
save('bitpix8.fits', fits.HDUList([fits.PrimaryHDU(ints(np.uint8))]))
save('bitpix16.fits', fits.HDUList([fits.PrimaryHDU(ints(np.int16))]))
save('bitpix32.fits', fits.HDUList([fits.PrimaryHDU(ints(np.int32))]))
i64 = ints(np.int64)
i64.flat[3] = 2**53 + 1            # not representable in double
i64.flat[4] = 2**24 + 1            # not representable in float
save('bitpix64.fits', fits.HDUList([fits.PrimaryHDU(i64)]))
f32 = rng.normal(100, 50, size=(H, W)).astype(np.float32)
f32.flat[5] = np.nan
f32.flat[6] = np.float32(1e-45)    # denormal
f32.flat[7] = np.finfo(np.float32).max
f32.flat[8] = -0.0
save('bitpix-32.fits', fits.HDUList([fits.PrimaryHDU(f32)]))
f64 = rng.normal(0, 1e10, size=(H, W))
f64.flat[5] = np.nan
f64.flat[6] = 1e300                # beyond float range: inf as float
f64.flat[7] = 1.0 + 2**-40         # rounds as float, exact as double
save('bitpix-64.fits', fits.HDUList([fits.PrimaryHDU(f64)]))

# BSCALE/BZERO.
save('scaled8.fits', primary_raw(ints(np.uint8), [('BSCALE', 0.5), ('BZERO', -20.0)]))
save('scaled16.fits', primary_raw(ints(np.int16), [('BSCALE', 0.25), ('BZERO', 1000.5)]))
save('scaled32.fits', primary_raw(ints(np.int32), [('BSCALE', 1.0e-3), ('BZERO', -5.0)]))
save('scaled64.fits', primary_raw(rng.integers(-10**12, 10**12, size=(H, W), dtype=np.int64),
                                  [('BSCALE', 3.0e-4), ('BZERO', 12.5)]))
f32_small = f32.copy()
f32_small.flat[7] = 1.0e30
save('scaled-32.fits', primary_raw(f32_small, [('BSCALE', 2.5), ('BZERO', -1.0)]))

# Unsigned and signed-byte conventions: astropy writes BZERO itself for these numpy types.
save('uint16.fits', fits.HDUList([fits.PrimaryHDU(ints(np.uint16))]))
save('uint32.fits', fits.HDUList([fits.PrimaryHDU(ints(np.uint32))]))
u64 = ints(np.uint64)
u64.flat[3] = 2**64 - 2**39 - 1    # rounding of the top range
save('uint64.fits', fits.HDUList([fits.PrimaryHDU(u64)]))
save('int8.fits', fits.HDUList([fits.PrimaryHDU(ints(np.int8))]))

# BLANK: with scaling astropy turns BLANK into NaN; unscaled it returns the stored values.
b16 = ints(np.int16)
b16[b16 == -999] = -998
b16.flat[[10, 20, 30]] = -999
save('blank16.fits', primary_raw(b16, [('BSCALE', 2.0), ('BZERO', 10.0), ('BLANK', -999)]))
b32 = ints(np.int32)
b32[b32 == -2147483648] = 0
b32.flat[[11, 12, 500]] = -2147483648
save('blank32.fits', primary_raw(b32, [('BLANK', -2147483648)]))

# Multi-extension: IMAGE, a BINTABLE with a heap (PCOUNT > 0), an ASCII TABLE, then IMAGE again.
primary = fits.PrimaryHDU()
primary.header['ORIGIN'] = 'synthetic test field'
sci1 = fits.ImageHDU(f32, name='SCI1')
vla = fits.Column(name='SPECTRUM', format='PJ()',
                  array=np.array([np.arange(n, dtype=np.int32) for n in (3, 700, 11)], dtype=object))
flux = fits.Column(name='FLUX', format='E', array=np.array([1.5, 2.5, 3.5], dtype=np.float32))
table = fits.BinTableHDU.from_columns([vla, flux], name='STARS')
ascii_table = fits.TableHDU.from_columns([fits.Column(name='ID', format='I6', array=np.array([1, 2, 3]))], name='IDS')
sci2 = fits.ImageHDU(ints(np.int16), name='SCI2')
save('mef.fits', fits.HDUList([primary, sci1, table, ascii_table, sci2]))

# 3-D cube: the first plane is served.
cube = rng.normal(size=(3, H, W)).astype(np.float32)
save('cube.fits', fits.HDUList([fits.PrimaryHDU(cube)]))

# Random groups (FITS 4.0 section 6), then an image: NAXIS1 = 0 and PCOUNT/GCOUNT size the data.
groups = fits.GroupData(np.arange(3 * 4 * 5, dtype=np.float32).reshape(3, 1, 4, 5), bitpix=-32,
                        parnames=['PAR1', 'PAR2'], pardata=[np.arange(3.0), np.ones(3)])
save('groups.fits', fits.HDUList([fits.GroupsHDU(groups), fits.ImageHDU(f32, name='AFTER')]))

# A 1-D array: no 2-D plane to serve.
save('vector.fits', fits.HDUList([fits.PrimaryHDU(np.arange(10, dtype=np.int16))]))

# Header cards of every kind. (No '&' and no doubled quote before a space inside a long string here:
# astropy 5.2 drops text around those when reading CONTINUE cards.)
hdr = fits.Header()
hdr['OBSERVER'] = ("  leading spaces kept", 'section 4.2.1.1')
hdr['QUOTED'] = ("it's 'quoted'", 'doubled quotes')
hdr['EMPTYSTR'] = ''
hdr['LONGSTR'] = ("The synthetic field's description runs long enough to need several CONTINUE cards, "
                  "with it's own apostrophe, ending here.", 'and a comment')
hdr['LONGNC'] = 'x' * 150
hdr['HIERARCH MOSAIC CAMERA GAIN'] = (1.75, 'e-/ADU')
hdr['HIERARCH MOSAIC FILTER NAME'] = 'wide red'
hdr['FLAG'] = (True, 'logical T')
hdr['OFF'] = False
hdr['INT32'] = -2147483648
hdr['INT64'] = 9223372036854775807
hdr['NEGINT64'] = -9223372036854775808
hdr['BIGINT'] = 123456789012345678901234567890
hdr['EXPOSURE'] = (1.0e-5, 'seconds')
hdr['PI'] = 3.141592653589793
hdr['CPLX'] = (1.5 - 2.25j)
hdr['UNDEF'] = (None, 'no value')
hdr.append(fits.Card.fromstring("DEXP    =             1.25D+03 / D exponent"))
hdr.append(fits.Card.fromstring("DEXPNEG =              -7.5D-12"))
hdr.append(fits.Card.fromstring("FREEINT = 42 / free format integer"))
hdr.append(fits.Card.fromstring("FREESTR =    'free'   / free format string"))
hdr.append(fits.Card.fromstring("NOVALUE   text without a value indicator"))
hdr['COMMENT'] = 'a comment card'
hdr['HISTORY'] = 'a history card'
hdr[''] = 'a blank-keyword card'
save('header.fits', fits.HDUList([fits.PrimaryHDU(ints(np.int16), header=hdr)]))

with open(os.path.join(out, 'expected.json'), 'w') as f:
    json.dump(files, f)
