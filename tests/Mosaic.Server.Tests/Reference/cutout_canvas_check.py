"""Checks a canvas cutout's values against the chips, with astropy.wcs and numpy (Debian packages): each cutout
pixel's sky position (the cutout's WCS) goes to chip pixels (the chip's WCS, SIP included) where the bilinear
interpolation of the four chip pixels around it should equal the cutout value, to 0.01 px of the local gradient.
Usage: cutout_canvas_check.py CHIPS_FILE CUTOUT; prints JSON."""
import json, sys, warnings
import numpy as np
from astropy.io import fits
from astropy.wcs import WCS

chips_file, cutout = sys.argv[1], sys.argv[2]
with warnings.catch_warnings():
    warnings.simplefilter("ignore")
    c = fits.open(cutout)
    cut = c[0].data.astype(np.float64)
    wc = WCS(c[0].header)
    chips = []
    for h in fits.open(chips_file, do_not_scale_image_data=True)[1:]:
        stored = h.data
        # Physical values (FITS 4.0 section 4.4.2.5), NaN where the stored value is BLANK.
        physical = h.header.get("BZERO", 0.0) + h.header.get("BSCALE", 1.0) * stored.astype(np.float64)
        if "BLANK" in h.header:
            physical[stored == h.header["BLANK"]] = np.nan
        chips.append((physical, WCS(h.header)))
h, w = cut.shape
jj, ii = np.mgrid[1:h + 1, 1:w + 1]
ra, dec = wc.all_pix2world(ii.ravel(), jj.ravel(), 1)
checked, worst, nan_outside, worst_at = 0, 0.0, 0, None
inside_any = np.zeros(ra.shape, bool)
for data, wcs in chips:
    ch, cw = data.shape
    px, py = wcs.all_world2pix(ra, dec, 1, tolerance=1e-10)
    x0, y0 = np.floor(px).astype(int), np.floor(py).astype(int)
    inside = (x0 >= 1) & (y0 >= 1) & (x0 < cw) & (y0 < ch)
    # Within 0.01 px of a chip edge counts as on it: the canvas's own mapping is good to about 0.003 px.
    m = 0.01
    inside_any |= (px >= 0.5 - m) & (py >= 0.5 - m) & (px < cw + 0.5 + m) & (py < ch + 0.5 + m)
    for k in np.flatnonzero(inside):
        fx, fy = px[k] - x0[k], py[k] - y0[k]
        q = data[y0[k] - 1:y0[k] + 1, x0[k] - 1:x0[k] + 1]
        if not np.isfinite(q).all():
            continue
        expected = (q[0, 0] * (1 - fx) * (1 - fy) + q[0, 1] * fx * (1 - fy) + q[1, 0] * (1 - fx) * fy + q[1, 1] * fx * fy)
        value = cut.ravel()[k]
        tolerance = 0.01 * (q.max() - q.min()) + 1e-3
        ratio = abs(value - expected) / tolerance
        if ratio > worst:
            worst, worst_at = ratio, [int(k % w) + 1, int(k // w) + 1, float(px[k]), float(py[k]), float(value), float(expected)]
        checked += 1
nan_outside = int(np.isnan(cut.ravel()[~inside_any]).sum())
print(json.dumps({"checked": checked, "worstRatio": worst, "outside": int((~inside_any).sum()), "nanOutside": nan_outside, "worstAt": worst_at}))
