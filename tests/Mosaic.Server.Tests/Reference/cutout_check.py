"""Reads a cutout and its source with astropy (Debian python3-astropy) and reports how they agree.
Usage: check.py SOURCE HDU CUTOUT X0 Y0 [RA DEC]; prints JSON."""
import json, sys, warnings
import numpy as np
from astropy.io import fits
from astropy.wcs import WCS

source, index, cutout, x0, y0 = sys.argv[1], int(sys.argv[2]), sys.argv[3], int(sys.argv[4]), int(sys.argv[5])
out = {}
with fits.open(cutout) as c:
    try:
        c.verify("exception")
        out["verified"] = True
    except Exception as e:
        out["verified"] = False
        out["verifyError"] = str(e)
    out["hdus"] = len(c)
with fits.open(cutout, do_not_scale_image_data=True) as c, fits.open(source, do_not_scale_image_data=True) as s:
    ch, sh = c[0].header, s[index].header
    out["bitpix"], out["sourceBitpix"] = ch["BITPIX"], sh["BITPIX"]
    for k in ("BZERO", "BSCALE", "BLANK", "EXTNAME", "BUNIT", "DATE", "CRPIX1", "CRPIX2", "LTV1", "CHECKSUM", "EXPLEN"):
        out["cut_" + k] = ch.get(k)
        out["src_" + k] = sh.get(k)
    out["history"] = [str(v) for v in ch.get("HISTORY", [])]
    out["hierarch"] = any("PIPELINE" in k for k in ch.keys())
    out["shape"] = list(c[0].data.shape)
    out["dtype"] = str(c[0].data.dtype)
    # Stored integers equal to BLANK (FITS 4.0 section 4.4.2.5): the pixels a reader must treat as undefined.
    out["blankCount"] = int((c[0].data == ch["BLANK"]).sum()) if "BLANK" in ch else 0
    h, w = c[0].data.shape
    if not isinstance(s[index], fits.CompImageHDU):
        raw = s[index].data[y0 - 1:y0 - 1 + h, x0 - 1:x0 - 1 + w]
        floats = raw.dtype.kind == "f"
        out["rawEqual"] = bool(np.array_equal(raw, c[0].data, equal_nan=floats)) and raw.dtype == c[0].data.dtype
with fits.open(cutout) as c, fits.open(source) as s:
    cut = np.asarray(c[0].data, dtype=np.float64)
    h, w = cut.shape
    ref = np.asarray(s[index].data, dtype=np.float64)[y0 - 1:y0 - 1 + h, x0 - 1:x0 - 1 + w]
    out["valuesEqual"] = bool(np.array_equal(cut, ref, equal_nan=True))
    out["maskedCount"] = int(np.isnan(cut).sum())
    out["maxValueDiff"] = float(np.nanmax(np.abs(cut - ref))) if np.isfinite(cut).any() else 0.0
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        wc, ws = WCS(c[0].header), WCS(s[index].header)
    out["sip"] = wc.sip is not None
    jj, ii = np.mgrid[1:h + 1:max(1, h // 7), 1:w + 1:max(1, w // 7)]
    ii, jj = ii.ravel().astype(float), jj.ravel().astype(float)
    rc, dc = wc.all_pix2world(ii, jj, 1)
    rs, ds = ws.all_pix2world(ii + x0 - 1, jj + y0 - 1, 1)
    dra = (rc - rs + 180.0) % 360.0 - 180.0
    out["maxSkyDiffDeg"] = float(max(np.max(np.abs(dra * np.cos(np.radians(ds)))), np.max(np.abs(dc - ds))))
    if len(sys.argv) > 7:
        ra, dec = float(sys.argv[6]), float(sys.argv[7])
        px, py = wc.all_world2pix([[ra, dec]], 1, tolerance=1e-10)[0]
        sx, sy = ws.all_world2pix([[ra, dec]], 1, tolerance=1e-10)[0]
        out["cutPixel"] = [float(px), float(py)]
        out["sourcePixel"] = [float(sx), float(sy)]
print(json.dumps(out))
