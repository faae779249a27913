"""Reference measurements for the demo-field tests.

Reads the generated FITS files with astropy.io.fits, converts coordinates with astropy.wcs and computes statistics
with numpy (Debian's python3-astropy and python3-numpy), so the tests compare the generator against libraries it
does not share code with. It stays running for a whole test run: see main().
"""
import json
import sys
import warnings

import numpy as np
from astropy.io import fits
from astropy.wcs import WCS

_files = {}


def hdu(path, ext):
    if path not in _files:
        _files[path] = fits.open(path, memmap=False)
    return _files[path][ext]


def wcs_of(path, ext):
    with warnings.catch_warnings():
        warnings.simplefilter("error")  # a header astropy has to repair is a failure, not a warning
        return WCS(hdu(path, ext).header)


def clean(values):
    """NaN is not JSON: send null."""
    return [None if (isinstance(v, float) and not np.isfinite(v)) else v for v in values]


def angular_distance_arcsec(ra1, dec1, ra2, dec2):
    """Great-circle distance by the Vincenty formula (common practice; exact at all separations)."""
    r1, d1, r2, d2 = map(np.radians, (ra1, dec1, ra2, dec2))
    dra = r2 - r1
    num = np.hypot(np.cos(d2) * np.sin(dra), np.cos(d1) * np.sin(d2) - np.sin(d1) * np.cos(d2) * np.cos(dra))
    den = np.sin(d1) * np.sin(d2) + np.cos(d1) * np.cos(d2) * np.cos(dra)
    return np.degrees(np.arctan2(num, den)) * 3600.0


def points(values):
    return np.array(values, dtype=float).reshape(-1, 2)


def op_pix2world(op):
    w = wcs_of(op["file"], op["ext"])
    world = w.all_pix2world(points(op["pixels"]), 0)
    return {"world": world.tolist()}


def op_world2pix(op):
    w = wcs_of(op["file"], op["ext"])
    pix = w.all_world2pix(points(op["world"]), 0, tolerance=1e-9, maxiter=100)
    return {"pixels": pix.tolist()}


def op_sip_inverse(op):
    """pixel -> sky with A/B, sky -> undistorted pixel with the linear WCS alone, then AP/BP back to a pixel."""
    w = wcs_of(op["file"], op["ext"])
    world = w.all_pix2world(points(op["pixels"]), 0)
    linear = w.wcs_world2pix(world, 0)
    # astropy's focal-plane coordinates (those sip_pix2foc returns) are the linear pixel less CRPIX, here origin 0.
    back = w.sip_foc2pix(linear - w.wcs.crpix, 0)
    return {"pixels": back.tolist()}


def op_header(op):
    header = hdu(op["file"], op["ext"]).header
    out = {}
    for k in op["keys"]:
        value = header.get(k)
        # COMMENT and HISTORY come back as a list of their texts.
        out[k] = [str(c) for c in value] if k in ("COMMENT", "HISTORY") and value is not None else value
    return out


def op_box_stats(op):
    data = hdu(op["file"], op["ext"]).data
    out = []
    for x0, y0, x1, y1 in op["boxes"]:
        box = data[y0:y1 + 1, x0:x1 + 1].astype(np.float64)
        finite = box[np.isfinite(box)]
        median = float(np.median(finite))
        mad = float(np.median(np.abs(finite - median)))
        # 1.4826 MAD estimates sigma for a normal distribution (common practice).
        out.append({"median": median, "madSigma": 1.4826 * mad, "max": float(finite.max()), "count": int(finite.size),
                    "nan": int(box.size - finite.size)})
    return {"boxes": out}


def op_nan_census(op):
    data = hdu(op["file"], op["ext"]).data
    mask = np.isnan(data)
    out = []
    for x, y in op["pixels"]:
        x, y = int(round(x)), int(round(y))
        column = mask[:, x]
        row = mask[y, :]
        out.append({"nan": bool(mask[y, x]), "columnRun": run_length(column, y), "rowRun": run_length(row, x)})
    return {"total": int(mask.sum()), "pixels": out}


def run_length(line, i):
    if not line[i]:
        return 0
    lo = i
    while lo > 0 and line[lo - 1]:
        lo -= 1
    hi = i
    while hi < line.size - 1 and line[hi + 1]:
        hi += 1
    return hi - lo + 1


def op_annulus_median(op):
    """Median of data x GAIN (electrons) over every pixel of every chip whose sky position lies in [rMin, rMax] arcsec of a centre."""
    values = []
    ra0, dec0 = op["centre"]
    path = op["file"]
    for ext in op["exts"]:
        h = hdu(path, ext)
        ny, nx = h.data.shape
        y, x = np.mgrid[0:ny, 0:nx]
        world = wcs_of(path, ext).all_pix2world(np.column_stack([x.ravel(), y.ravel()]).astype(float), 0)
        r = angular_distance_arcsec(ra0, dec0, world[:, 0], world[:, 1])
        pick = (r >= op["rMin"]) & (r <= op["rMax"])
        chosen = h.data.ravel()[pick].astype(np.float64) * float(h.header["GAIN"])
        values.append(chosen[np.isfinite(chosen)])
    pooled = np.concatenate(values)
    return {"median": float(np.median(pooled)) if pooled.size else None, "count": int(pooled.size)}


OPS = {
    "pix2world": op_pix2world,
    "world2pix": op_world2pix,
    "sip_inverse": op_sip_inverse,
    "header": op_header,
    "box_stats": op_box_stats,
    "nan_census": op_nan_census,
    "annulus_median": op_annulus_median,
}


def main():
    """One request (a JSON list of operations) per input line, one JSON result list per output line, until EOF."""
    for line in sys.stdin:
        if not line.strip():
            continue
        try:
            results = [OPS[op["op"]](op) for op in json.loads(line)]
            reply = {"ok": True, "results": results}
        except Exception as e:  # reported to the test, which fails with it
            import traceback
            reply = {"ok": False, "error": "".join(traceback.format_exception(e))}
        sys.stdout.write(json.dumps(reply, allow_nan=False) + "\n")
        sys.stdout.flush()


if __name__ == "__main__":
    main()
