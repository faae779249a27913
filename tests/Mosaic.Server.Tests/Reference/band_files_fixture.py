"""Folders of single-chip files for band grouping, written with astropy.io.fits, and what astropy.wcs (wcslib) makes
of them once the server has made its canvas.

Usage:
  band_files_fixture.py write DATA_DIR
      writes
        quad/q{1..4}_a.fits   FILTER = 'r' in the primary header, the chip in the primary HDU (0.6"/px, 120 x 100)
        quad/q{1..4}_b.fits   no primary FILTER; the chip in extension 1 (EXTNAME SCI, FILTER = 'g'; 0.65"/px, 110 x 95)
                              four TAN-SIP chips per band in a 2 x 2 layout with gaps, one star at one sky position
        names/names_r.fits, names/p1_r.fits, names/p2-r.fits  no FILTER: band r by the file-name rule
        names/red.fits        band red;  names/p3_r.fits: not FITS;  names/zz_x.fits: not FITS either
        mixed.fits            one file, extensions with FILTER r, g, r and none (EXTNAME A1, B1, A2, C1)
        patchy/p_1.fits, p_2.fits with WCS and p_3.fits without, all FILTER = 'i'
      prints the values astropy reads at chosen pixels and the finite-pixel counts of each band.
  band_files_fixture.py reference DATA_DIR CANVAS_HEADER_JSON
      given the canvas header cards the server made for quad ({keyword: value}), prints every chip's corners and
      centre on the canvas, probe points (sky position -> file, chip pixel, value) and the star's canvas position.
"""
import json, os, sys
import numpy as np
from astropy.io import fits
from astropy.wcs import WCS

FIELD = (210.0, -5.0)          # synthetic pointing (ICRS degrees)
BANDS = {
    # band: (file suffix, scale "/px, (width, height), chip offsets x, chip offsets y, rotation per chip (deg), level)
    "r": ("a", 0.60, (120, 100), (-128, 8), (-108, 8), (0.0, 0.15, -0.1, 0.2), 1000.0),
    "g": ("b", 0.65, (110, 95), (-118, 7), (-99, 7), (0.3, -0.2, 0.1, -0.25), 500.0),
}
SIP = [{"A_2_0": 3e-6, "B_0_2": 2e-6}, {"A_1_1": -1e-6, "B_2_0": 1e-6},
       {"A_0_2": 2e-6, "B_1_1": -1.5e-6}, {"A_2_0": -1e-6, "B_0_2": 1e-6}]


def chip_header(band, k):
    _, scale, _, ox, oy, rot, _ = BANDS[band]
    c, r = k % 2, k // 2
    h = fits.Header()
    h["CTYPE1"], h["CTYPE2"] = "RA---TAN-SIP", "DEC--TAN-SIP"
    h["CRVAL1"], h["CRVAL2"] = FIELD
    h["CRPIX1"], h["CRPIX2"] = float(-ox[c]), float(-oy[r])
    s, t = scale / 3600.0, np.radians(rot[k])
    h["CD1_1"], h["CD1_2"] = -s * np.cos(t), s * np.sin(t)
    h["CD2_1"], h["CD2_2"] = s * np.sin(t), s * np.cos(t)
    h["RADESYS"] = "ICRS"
    h["A_ORDER"], h["B_ORDER"] = 2, 2
    for key, value in SIP[k].items():
        h[key] = value
    return h


def background(shape, level):
    j, i = np.mgrid[0:shape[0], 0:shape[1]].astype(np.float64)
    return level + 0.3 * i + 0.2 * j + 3.0 * np.sin(i / 6.0) * np.cos(j / 9.0)


def star_sky():
    # on r chip 3 (upper right) at chip pixel (40.3, 50.7)
    return WCS(chip_header("r", 3)).all_pix2world([[40.3, 50.7]], 1)[0]


def add_star(data, header, sky):
    x, y = WCS(header).all_world2pix([[sky[0], sky[1]]], 1, tolerance=1e-12)[0]
    sigma = 1.2 / (np.hypot(header["CD1_1"], header["CD2_1"]) * 3600.0)
    j, i = np.mgrid[0:data.shape[0], 0:data.shape[1]].astype(np.float64)
    data += 4000.0 * np.exp(-(((i + 1 - x) ** 2 + (j + 1 - y) ** 2) / (2 * sigma ** 2)))


def quad_chip(band, k):
    suffix, _, (w, h), _, _, _, level = BANDS[band]
    header = chip_header(band, k)
    data = background((h, w), level + 40 * k)
    add_star(data, header, star_sky())
    data[3 + k, 5] = np.nan
    return header, data.astype(np.float32)


def values(path, hdu, points):
    with fits.open(path) as hl:
        d = hl[hdu].data
        return {f"{x},{y}": (None if np.isnan(d[y - 1, x - 1]) else float(d[y - 1, x - 1])) for (x, y) in points}


def finite(paths):
    total = 0
    for p in paths:
        with fits.open(p) as hl:
            total += sum(int(np.count_nonzero(np.isfinite(h.data))) for h in hl if h.data is not None)
    return total


def write(root):
    quad = os.path.join(root, "quad")
    os.makedirs(quad, exist_ok=True)
    for k in range(4):
        header, data = quad_chip("r", k)
        primary = fits.PrimaryHDU(data, header=header)
        primary.header["FILTER"] = "r"
        primary.header["BUNIT"] = "adu"
        primary.writeto(os.path.join(quad, f"q{k + 1}_a.fits"), overwrite=True)
        header, data = quad_chip("g", k)
        ext = fits.ImageHDU(data, header=header, name="SCI")
        ext.header["FILTER"] = "g"
        ext.header["BUNIT"] = "adu"
        fits.HDUList([fits.PrimaryHDU(), ext]).writeto(os.path.join(quad, f"q{k + 1}_b.fits"), overwrite=True)

    names = os.path.join(root, "names")
    os.makedirs(names, exist_ok=True)
    rng = np.random.default_rng(11)
    for i, name in enumerate(("names_r.fits", "p1_r.fits", "p2-r.fits", "red.fits")):
        data = rng.normal(100.0 + 10 * i, 3.0, size=(40, 60)).astype(np.float32)
        data[2, 3 + i] = np.nan
        fits.PrimaryHDU(data).writeto(os.path.join(names, name), overwrite=True)
    for name in ("p3_r.fits", "zz_x.fits"):
        with open(os.path.join(names, name), "wb") as f:
            f.write(b"not a FITS file, only text " * 200)

    hdus = [fits.PrimaryHDU()]
    for i, (extname, filt) in enumerate((("A1", "r"), ("B1", "g"), ("A2", "r"), ("C1", None))):
        ext = fits.ImageHDU(rng.normal(20.0 * (i + 1), 1.0, size=(30, 50)).astype(np.float32), name=extname)
        if filt:
            ext.header["FILTER"] = filt
        hdus.append(ext)
    fits.HDUList(hdus).writeto(os.path.join(root, "mixed.fits"), overwrite=True)

    patchy = os.path.join(root, "patchy")
    os.makedirs(patchy, exist_ok=True)
    for k in range(3):
        header, data = quad_chip("r", k)
        primary = fits.PrimaryHDU(data, header=header if k < 2 else None)
        primary.header["FILTER"] = "i"
        primary.writeto(os.path.join(patchy, f"p_{k + 1}.fits"), overwrite=True)

    out = {
        "names": {
            "p1_r": values(os.path.join(names, "p1_r.fits"), 0, [(1, 1), (17, 23), (60, 40)]),
            "red": values(os.path.join(names, "red.fits"), 0, [(9, 9)]),
        },
        "mixed": {"A2": values(os.path.join(root, "mixed.fits"), 3, [(4, 5)]), "C1": values(os.path.join(root, "mixed.fits"), 4, [(4, 5)])},
        "finite": {
            "quad_r": finite([os.path.join(quad, f"q{k}_a.fits") for k in range(1, 5)]),
            "quad_g": finite([os.path.join(quad, f"q{k}_b.fits") for k in range(1, 5)]),
            "names_r": finite([os.path.join(names, n) for n in ("names_r.fits", "p1_r.fits", "p2-r.fits")]),
        },
    }
    print(json.dumps(out))


def reference(root, header_json):
    h = fits.Header()
    for key, value in json.loads(header_json).items():
        h[key] = value
    cw = WCS(h)
    out = {}
    for band, (suffix, _, (w, hgt), _, _, _, _) in BANDS.items():
        chips = []
        for k in range(4):
            name = f"q{k + 1}_{suffix}"
            hdu = 0 if band == "r" else 1
            with fits.open(os.path.join(root, "quad", name + ".fits")) as hl:
                chips.append((k, name, hdu, WCS(hl[hdu].header), hl[hdu].data.astype(np.float64)))
        entries = []
        for (k, name, hdu, w_, data) in chips:
            def to_canvas(x, y):
                sky = w_.all_pix2world([[x, y]], 1)[0]
                return [float(v) for v in cw.all_world2pix([[sky[0], sky[1]]], 1)[0]]
            corners = [to_canvas(x, y) for (x, y) in ((0.5, 0.5), (w + 0.5, 0.5), (w + 0.5, hgt + 0.5), (0.5, hgt + 0.5))]
            cx, cy = (w + 1) / 2.0, (hgt + 1) / 2.0
            points = []
            for (x, y) in ((17.3, 21.8), (cx + 0.27, cy - 0.19), (w - 10.4, hgt - 7.6)):
                sky = w_.all_pix2world([[x, y]], 1)[0]
                # which chips hold it, by astropy all_world2pix on each (origin 1)
                hits = []
                for (k2, name2, hdu2, w2, data2) in chips:
                    hx, hy = w2.all_world2pix([[sky[0], sky[1]]], 1, tolerance=1e-12, maxiter=100)[0]
                    if 0.5 <= hx < data2.shape[1] + 0.5 and 0.5 <= hy < data2.shape[0] + 0.5:
                        hits.append((k2, name2, float(hx), float(hy), data2))
                assert len(hits) == 1 and hits[0][0] == k, (band, name, x, y)
                _, _, hx, hy, d = hits[0]
                px, py = int(np.floor(hx + 0.5)), int(np.floor(hy + 0.5))
                points.append({"ra": float(sky[0]), "dec": float(sky[1]), "x": hx, "y": hy, "px": px, "py": py,
                               "value": float(d[py - 1, px - 1])})
            entries.append({"index": k, "name": name, "file": name + ".fits", "fitsIndex": hdu, "corners": corners,
                            "centre": to_canvas(cx, cy), "centreChip": [cx, cy], "points": points})
        out[band] = entries
    star = star_sky()
    sx, sy = cw.all_world2pix([[star[0], star[1]]], 1)[0]
    out["star"] = {"canvasX": float(sx), "canvasY": float(sy)}
    out["canvas"] = {"width": int(h["NAXIS1"]), "height": int(h["NAXIS2"])}
    print(json.dumps(out))


if __name__ == "__main__":
    if sys.argv[1] == "write":
        write(sys.argv[2])
    else:
        reference(sys.argv[2], sys.argv[3])
