# Reference transforms from astropy.wcs (wcslib underneath), Debian's python3-astropy.
# stdin: {"cards": {keyword: value}, "pixels": [[x, y], ...], "sky": [[lon, lat], ...]}, pixels 1-based.
# stdout: {"sky": [[lon, lat] or null], "pixels": [[x, y] or null]}; null where astropy finds no solution.
import json
import sys
import warnings

import numpy as np
from astropy.io import fits
from astropy.wcs import WCS

warnings.simplefilter("ignore")
request = json.load(sys.stdin)
header = fits.Header()
for key, value in request["cards"].items():
    header[key] = value
wcs = WCS(header)


def rows(array):
    return [None if not np.all(np.isfinite(r)) else [float(r[0]), float(r[1])] for r in array]


out = {}
pixels = np.array(request.get("pixels") or [], dtype=float).reshape(-1, 2)
sky = np.array(request.get("sky") or [], dtype=float).reshape(-1, 2)
out["sky"] = rows(wcs.all_pix2world(pixels, 1)) if len(pixels) else []
if len(sky):
    with np.errstate(all="ignore"):
        out["pixels"] = rows(wcs.all_world2pix(sky, 1, tolerance=1e-10, maxiter=50, quiet=True)) \
            if wcs.sip is not None else rows(wcs.wcs_world2pix(sky, 1))
else:
    out["pixels"] = []
print(json.dumps(out))
