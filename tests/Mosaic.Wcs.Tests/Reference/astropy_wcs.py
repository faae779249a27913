# Reference transforms from astropy.wcs (wcslib underneath), Debian's python3-astropy.
# stdin: one request {"cards": {keyword: value}, "pixels": [[x, y], ...], "sky": [[lon, lat], ...]}, pixels 1-based,
#        or a list of such requests (one process for a whole test class).
# stdout: {"sky": [[lon, lat] or null], "pixels": [[x, y] or null]} (or a list of them); null where astropy finds
#         no solution.
import json
import sys
import warnings

import numpy as np
from astropy.io import fits
from astropy.wcs import WCS

warnings.simplefilter("ignore")


def rows(array):
    return [None if not np.all(np.isfinite(r)) else [float(r[0]), float(r[1])] for r in array]


def answer(request):
    header = fits.Header()
    for key, value in request["cards"].items():
        header[key] = value
    wcs = WCS(header)
    wcs.wcs.set()
    # The celestial pair may be in either order and among other axes: read and write only those two columns,
    # other axes at pixel 1 (their world value there for sky -> pixel).
    lng, lat, naxis = wcs.wcs.lng, wcs.wcs.lat, wcs.wcs.naxis
    out = {}
    pixels = np.array(request.get("pixels") or [], dtype=float).reshape(-1, 2)
    sky = np.array(request.get("sky") or [], dtype=float).reshape(-1, 2)
    with np.errstate(all="ignore"):
        if len(pixels):
            full = np.ones((len(pixels), naxis))
            full[:, 0:2] = pixels
            out["sky"] = rows(wcs.all_pix2world(full, 1)[:, [lng, lat]])
        else:
            out["sky"] = []
        if len(sky):
            world = np.tile(wcs.all_pix2world(np.ones((1, naxis)), 1), (len(sky), 1))
            world[:, lng] = sky[:, 0]
            world[:, lat] = sky[:, 1]
            pixels_out = wcs.all_world2pix(world, 1, tolerance=1e-10, maxiter=50, quiet=True) \
                if wcs.sip is not None else wcs.wcs_world2pix(world, 1)
            out["pixels"] = rows(pixels_out[:, 0:2])
        else:
            out["pixels"] = []
    return out


request = json.load(sys.stdin)
print(json.dumps([answer(r) for r in request] if isinstance(request, list) else answer(request)))
