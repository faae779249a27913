# Reference for the field canvas: astropy.wcs (wcslib and astropy's SIP code underneath) and numpy, Debian's
# python3-astropy and python3-numpy. Reads the chips from the FITS files the test wrote, the canvas WCS from cards.
# stdin: {"mode": ..., "canvas": {keyword: value}, "chips": [{"file": path, "hdu": n}], ...}
#   mode "place":    "points": [[[x, y], ...] per chip] chip pixels (1-based) -> canvas pixels through the sky.
#   mode "map":      "points": [[x, y], ...] canvas pixels -> {"positions": [[[x, y] or null per chip] per point],
#                    "centres": [[x, y] per chip]} (canvas position of each chip's centre pixel ((W+1)/2, (H+1)/2)).
#   mode "resample": "values": path, "classes": path: the whole canvas by the documented method, written as raw
#                    float32 (row 0 = canvas y = 1) and uint8 classes: 0 outside every chip, 1 bilinear, 2 nearest
#                    (finite), 3 masked (NaN) inside a chip, 255 ambiguous (the result jumps by more than "jump", changes
#                    method or nearest pixel when the exact chip position moves by "eps" chip pixels: chip edges, seams).
#   mode "sky":      "headers": [{keyword: value} per chip], "sky": [[ra, dec], ...] -> {"chips": [[[x, y] or null per
#                    point] per chip], "canvas": [[x, y] per point]}.
#   mode "centre":   {"crval": [ra, dec] of the normalised mean of the chip centres' unit vectors, "scale": the median
#                    of sqrt(pixel area) at the chip centres (astropy.wcs.utils.proj_plane_pixel_area; the chips' CRPIX
#                    is their centre, where SIP adds no linear term)}.
#   The "resample" reply also writes "owners": uint8 per canvas pixel, 1 + index of the chip whose value it takes (0 none),
#   and "held": how many chips hold the pixel.
# stdout: JSON.
import json
import sys
import warnings

import numpy as np
from astropy.io import fits
from astropy.wcs import WCS
from astropy.wcs.utils import proj_plane_pixel_area

warnings.simplefilter("ignore")


def canvas_wcs(cards):
    header = fits.Header()
    for key, value in cards.items():
        header[key] = value
    return WCS(header), int(cards["NAXIS1"]), int(cards["NAXIS2"])


def open_chips(chips):
    out = []
    for c in chips:
        with fits.open(c["file"]) as f:
            hdu = f[c["hdu"]]
            out.append((WCS(hdu.header), np.asarray(hdu.data, dtype=np.float64)))
    return out


def to_chip(wcs, ra, dec):
    with np.errstate(all="ignore"):
        if wcs.sip is not None:
            x, y = wcs.all_world2pix(ra, dec, 1, tolerance=1e-11, maxiter=100, quiet=True)
        else:
            x, y = wcs.wcs_world2pix(ra, dec, 1)
    return np.asarray(x, dtype=float), np.asarray(y, dtype=float)


def pair(x, y):
    return None if not (np.isfinite(x) and np.isfinite(y)) else [float(x), float(y)]


def centre_on_canvas(canvas, wcs, data):
    h, w = data.shape
    ra, dec = wcs.all_pix2world([(w + 1) / 2.0], [(h + 1) / 2.0], 1)
    x, y = canvas.wcs_world2pix(ra, dec, 1)
    return float(x[0]), float(y[0])


def place(request):
    canvas, _, _ = canvas_wcs(request["canvas"])
    result = []
    for (wcs, _), points in zip(open_chips(request["chips"]), request["points"]):
        p = np.array(points, dtype=float).reshape(-1, 2)
        ra, dec = wcs.all_pix2world(p[:, 0], p[:, 1], 1)
        x, y = canvas.wcs_world2pix(ra, dec, 1)
        result.append([pair(a, b) for a, b in zip(x, y)])
    return {"canvas": result}


def map_points(request):
    canvas, _, _ = canvas_wcs(request["canvas"])
    chips = open_chips(request["chips"])
    p = np.array(request["points"], dtype=float).reshape(-1, 2)
    ra, dec = canvas.wcs_pix2world(p[:, 0], p[:, 1], 1)
    per_chip = [to_chip(wcs, ra, dec) for wcs, _ in chips]
    positions = [[pair(per_chip[c][0][i], per_chip[c][1][i]) for c in range(len(chips))] for i in range(len(p))]
    return {"positions": positions, "centres": [list(centre_on_canvas(canvas, w, d)) for w, d in chips]}


def sample(data, u, v):
    """The documented method at 0-based chip positions held by the chip: bilinear where the four neighbours are
    finite, else the nearest pixel. Returns values and classes (1 bilinear, 2 nearest finite, 3 NaN)."""
    h, w = data.shape
    i = np.floor(u).astype(np.int64)
    j = np.floor(v).astype(np.int64)
    interior = (i >= 0) & (i < w - 1) & (j >= 0) & (j < h - 1)
    ic = np.clip(i, 0, w - 2)
    jc = np.clip(j, 0, h - 2)
    a, b = data[jc, ic], data[jc, ic + 1]
    c, d = data[jc + 1, ic], data[jc + 1, ic + 1]
    fx, fy = u - i, v - j
    four = interior & np.isfinite(a) & np.isfinite(b) & np.isfinite(c) & np.isfinite(d)
    with np.errstate(all="ignore"):
        bilinear = (1 - fx) * (1 - fy) * a + fx * (1 - fy) * b + (1 - fx) * fy * c + fx * fy * d
    ni = np.clip(np.floor(u + 0.5).astype(np.int64), 0, w - 1)
    nj = np.clip(np.floor(v + 0.5).astype(np.int64), 0, h - 1)
    nearest = data[nj, ni]
    values = np.where(four, bilinear, nearest)
    classes = np.where(four, 1, np.where(np.isfinite(nearest), 2, 3)).astype(np.uint8)
    return values, classes


def header_wcs(cards):
    header = fits.Header()
    for key, value in cards.items():
        header[key] = value
    return WCS(header)


def sky(request):
    canvas, _, _ = canvas_wcs(request["canvas"])
    p = np.array(request["sky"], dtype=float).reshape(-1, 2)
    chips = []
    for cards in request["headers"]:
        x, y = to_chip(header_wcs(cards), p[:, 0], p[:, 1])
        chips.append([pair(a, b) for a, b in zip(x, y)])
    cx, cy = canvas.wcs_world2pix(p[:, 0], p[:, 1], 1)
    return {"chips": chips, "canvas": [pair(a, b) for a, b in zip(cx, cy)]}


def centre(request):
    vectors, scales = [], []
    for wcs, data in open_chips(request["chips"]):
        h, w = data.shape
        ra, dec = wcs.all_pix2world([(w + 1) / 2.0], [(h + 1) / 2.0], 1)
        a, d = np.radians(ra[0]), np.radians(dec[0])
        vectors.append([np.cos(d) * np.cos(a), np.cos(d) * np.sin(a), np.sin(d)])
        scales.append(np.sqrt(proj_plane_pixel_area(wcs.celestial)))
    m = np.mean(vectors, axis=0)
    m /= np.linalg.norm(m)
    ra = np.degrees(np.arctan2(m[1], m[0])) % 360.0
    dec = np.degrees(np.arctan2(m[2], np.hypot(m[0], m[1])))
    return {"crval": [float(ra), float(dec)], "scale": float(np.median(scales))}


def resample(request):
    canvas, width, height = canvas_wcs(request["canvas"])
    chips = open_chips(request["chips"])
    eps = float(request["eps"])
    yy, xx = np.mgrid[1:height + 1, 1:width + 1].astype(float)
    ra, dec = canvas.wcs_pix2world(xx, yy, 1)
    positions, boxes, centres = [], [], []
    for wcs, data in chips:
        h, w = data.shape
        # Only near the chip: far off it the SIP inverse is not asked for.
        edge_x = np.concatenate([np.linspace(0.5, w + 0.5, 64), np.full(64, w + 0.5), np.linspace(0.5, w + 0.5, 64), np.full(64, 0.5)])
        edge_y = np.concatenate([np.full(64, 0.5), np.linspace(0.5, h + 0.5, 64), np.full(64, h + 0.5), np.linspace(0.5, h + 0.5, 64)])
        er, ed = wcs.all_pix2world(edge_x, edge_y, 1)
        ex, ey = canvas.wcs_world2pix(er, ed, 1)
        near = (xx >= ex.min() - 5) & (xx <= ex.max() + 5) & (yy >= ey.min() - 5) & (yy <= ey.max() + 5)
        u = np.full(xx.shape, np.nan)
        v = np.full(xx.shape, np.nan)
        cu, cv = to_chip(wcs, ra[near], dec[near])
        u[near], v[near] = cu - 1, cv - 1
        positions.append((u, v))
        centres.append(centre_on_canvas(canvas, wcs, data))

    def method(du, dv):
        best = np.full(xx.shape, np.inf)
        values = np.full(xx.shape, np.nan)
        classes = np.zeros(xx.shape, dtype=np.uint8)
        owners = np.zeros(xx.shape, dtype=np.uint8)
        held_by = np.zeros(xx.shape, dtype=np.uint8)
        for index, ((wcs, data), (u, v), (cx, cy)) in enumerate(zip(chips, positions, centres)):
            h, w = data.shape
            uu, vv = u + du, v + dv
            with np.errstate(invalid="ignore"):
                held = (uu >= -0.5) & (uu < w - 0.5) & (vv >= -0.5) & (vv < h - 0.5)
            dist = (xx - cx) ** 2 + (yy - cy) ** 2
            take = held & (dist < best)
            held_by += held.astype(np.uint8)
            best[take] = dist[take]
            owners[take] = index + 1
            val, cls = sample(data, uu[take], vv[take])
            values[take] = val
            classes[take] = cls
        return values, classes, owners, held_by

    values, classes, owners, held_by = method(0.0, 0.0)
    ambiguous = np.zeros(xx.shape, dtype=bool)
    for du, dv in ((eps, 0), (-eps, 0), (0, eps), (0, -eps)):
        v2, c2, _, _ = method(du, dv)
        with np.errstate(invalid="ignore"):
            # A jump (an edge, a seam between chips of different levels) or a change of method or of nearest pixel.
            differ = (np.isnan(values) != np.isnan(v2)) | (np.abs(values - v2) > float(request["jump"]))
            differ |= (classes == 2) & (values != v2)
        ambiguous |= differ | (c2 != classes)
    classes[ambiguous] = 255
    values.astype("<f4").tofile(request["values"])
    classes.tofile(request["classes"])
    owners.tofile(request["owners"])
    held_by.tofile(request["held"])
    return {"width": width, "height": height}


request = json.load(sys.stdin)
mode = request["mode"]
print(json.dumps({"place": place, "map": map_points, "resample": resample, "sky": sky, "centre": centre}[mode](request)))
