"""Reads FITS files with astropy (Debian's python3-astropy), independently of Mosaic, for the browser tests.

Each command prints one JSON object. Pixel coordinates in and out are FITS 1-based (x = column, y = row), so
pixel (x, y) is data[y - 1, x - 1] in astropy's row-major array. Values are the physical values astropy gives
(BSCALE/BZERO applied), with NaN written as null.
"""
import json
import math
import sys

try:
    import numpy as np
    from astropy.io import fits
except ImportError as error:  # the C# side turns this into a test failure naming the package
    print(json.dumps({"error": f"python3-astropy / python3-numpy missing: {error}"}))
    sys.exit(3)


def finite_or_none(value):
    value = float(value)
    return None if math.isnan(value) else value


def pixel(path, hdu, x, y):
    with fits.open(path, memmap=False) as hdus:
        data = hdus[hdu].data
        return {"x": x, "y": y, "value": finite_or_none(data[y - 1, x - 1]),
                "width": int(data.shape[1]), "height": int(data.shape[0])}


def interior(data, margin):
    return data[margin:data.shape[0] - margin, margin:data.shape[1] - margin]


def brightest(path, hdu, margin):
    """The brightest finite pixel at least `margin` pixels from every edge."""
    with fits.open(path, memmap=False) as hdus:
        data = hdus[hdu].data.astype(np.float64)
        inner = interior(data, margin)
        row, col = np.unravel_index(np.nanargmax(inner), inner.shape)
        return {"x": int(col) + margin + 1, "y": int(row) + margin + 1, "value": float(inner[row, col])}


def masked(path, hdu, margin):
    """A NaN pixel at least `margin` pixels from every edge (the middle one of them in file order), or null."""
    with fits.open(path, memmap=False) as hdus:
        found = np.argwhere(np.isnan(interior(hdus[hdu].data, margin)))
    if len(found) == 0:
        return {"x": None, "y": None}
    row, col = found[len(found) // 2]
    return {"x": int(col) + margin + 1, "y": int(row) + margin + 1}


def header(path, hdu, key):
    with fits.open(path, memmap=False) as hdus:
        value = hdus[hdu].header.get(key)
        return {"key": key, "value": None if value is None else str(value).strip()}


COMMANDS = {
    "pixel": lambda a: pixel(a[0], int(a[1]), int(a[2]), int(a[3])),
    "brightest": lambda a: brightest(a[0], int(a[1]), int(a[2])),
    "masked": lambda a: masked(a[0], int(a[1]), int(a[2])),
    "header": lambda a: header(a[0], int(a[1]), a[2]),
}

if __name__ == "__main__":
    print(json.dumps(COMMANDS[sys.argv[1]](sys.argv[2:])))
