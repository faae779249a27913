"""Writes the synthetic field the load scripts serve: one square float32 frame of sky noise with Gaussian sources
and a TAN WCS, in a scenario of our own (no real object or instrument).

    /usr/bin/python3 make_field.py OUT.fits SIZE
"""
import sys

import numpy as np
from astropy.io import fits

out, size = sys.argv[1], int(sys.argv[2])
rng = np.random.default_rng(2026)
data = rng.normal(1000.0, 12.0, size=(size, size)).astype(np.float32)
yy, xx = np.mgrid[-12:13, -12:13]
for _ in range(size // 8):
    x, y = rng.integers(16, size - 16, size=2)
    flux = rng.pareto(1.5) * 200.0 + 50.0
    data[y - 12:y + 13, x - 12:x + 13] += (flux * np.exp(-(xx ** 2 + yy ** 2) / (2 * 2.2 ** 2))).astype(np.float32)
hdu = fits.PrimaryHDU(data)
h = hdu.header
h["CTYPE1"], h["CTYPE2"] = "RA---TAN", "DEC--TAN"
h["CRPIX1"], h["CRPIX2"] = size / 2 + 0.5, size / 2 + 0.5
h["CRVAL1"], h["CRVAL2"] = 210.0, -12.5
h["CDELT1"], h["CDELT2"] = -0.2 / 3600, 0.2 / 3600
h["BUNIT"] = "adu"
h["FILTER"] = "wide"
hdu.writeto(out, overwrite=True)
