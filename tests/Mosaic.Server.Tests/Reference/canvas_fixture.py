"""Camera-field test data for the whole-field canvas, written with astropy.io.fits, and what astropy.wcs (wcslib)
makes of it once the server has made its canvas.

Usage:
  canvas_fixture.py write DATA_DIR
      writes DATA_DIR/camera/cam_r.fits and cam_g.fits (two bands on different pixel grids, TAN-SIP chips with gaps,
      one chip of r without WCS) and DATA_DIR/blind/blind.fits (two chips, no WCS at all); prints {}.
  canvas_fixture.py reference DATA_DIR CANVAS_HEADER_JSON
      given the canvas header cards the server made ({keyword: value}), prints the reference JSON: probe points,
      tile pixels and the star, all through astropy's own WCS chain canvas pixel -> sky -> chip pixel.
"""
import json, os, sys
import numpy as np
from astropy.io import fits
from astropy.wcs import WCS
from astropy.wcs.utils import proj_plane_pixel_scales

FIELD = (150.0, 2.0)           # synthetic pointing (ICRS degrees)
STAR_SIGMA_ARCSEC = 1.0


def chip_header(crpix, scale_arcsec, rotation_deg, sip):
    h = fits.Header()
    h["CTYPE1"], h["CTYPE2"] = "RA---TAN-SIP", "DEC--TAN-SIP"
    h["CRVAL1"], h["CRVAL2"] = FIELD
    h["CRPIX1"], h["CRPIX2"] = crpix
    s = scale_arcsec / 3600.0
    r = np.radians(rotation_deg)
    h["CD1_1"] = -s * np.cos(r)   # east left, north up before the rotation
    h["CD1_2"] = s * np.sin(r)
    h["CD2_1"] = s * np.sin(r)
    h["CD2_2"] = s * np.cos(r)
    h["RADESYS"] = "ICRS"
    h["A_ORDER"] = 2
    h["B_ORDER"] = 2
    for key, value in sip.items():
        h[key] = value
    return h


def background(shape, level):
    j, i = np.mgrid[0:shape[0], 0:shape[1]].astype(np.float64)   # 0-based chip row j, column i
    return level + 0.3 * i + 0.2 * j + 3.0 * np.sin(i / 6.0) * np.cos(j / 9.0)


def add_star(data, header, sky):
    w = WCS(header)
    x, y = w.all_world2pix([[sky[0], sky[1]]], 1, tolerance=1e-12)[0]
    sigma = STAR_SIGMA_ARCSEC / (np.hypot(header["CD1_1"], header["CD2_1"]) * 3600.0)
    j, i = np.mgrid[0:data.shape[0], 0:data.shape[1]].astype(np.float64)
    data += 4000.0 * np.exp(-(((i + 1 - x) ** 2 + (j + 1 - y) ** 2) / (2 * sigma ** 2)))


# r: three 200 x 150 chips in a row, 20 px gaps, 0.5"/px, each turned a little; a fourth chip without WCS
R_CHIPS = [("CHIP01", 0), ("CHIP02", 1), ("CHIP03", 2)]
R_SIP = [{"A_2_0": 3e-6, "A_1_1": -1e-6, "B_0_2": 2e-6, "B_1_1": 1.5e-6},
         {"A_2_0": -2e-6, "A_0_2": 1e-6, "B_2_0": 1e-6, "B_0_2": -2.5e-6},
         {"A_1_1": 2e-6, "A_2_0": 1e-6, "B_1_1": -1e-6, "B_2_0": 2e-6}]
# g: two chips of other sizes at 0.55"/px with other turns and distortions: another pixel grid
G_CHIPS = [("GCHIP1", (140, 300), (282.5, 70.5), 0.4), ("GCHIP2", (120, 260), (282.5 - 320, 60.5), -0.3)]
G_SIP = [{"A_2_0": 1e-6, "B_0_2": 1e-6, "A_1_1": 2e-6}, {"A_0_2": -1e-6, "B_2_0": 2e-6, "B_1_1": -1e-6}]


def r_header(k):
    return chip_header((310.5 - 220 * k, 75.5), 0.5, 0.2 * (k - 1), R_SIP[k])


def write(root):
    os.makedirs(os.path.join(root, "camera"), exist_ok=True)
    os.makedirs(os.path.join(root, "blind"), exist_ok=True)
    # the star sits on r CHIP02 at chip pixel (60.3, 80.7) and on g GCHIP1
    star = WCS(r_header(1)).all_pix2world([[60.3, 80.7]], 1)[0]

    primary = fits.PrimaryHDU()
    primary.header["FILTER"] = "r"
    hdus = [primary]
    for (name, k) in R_CHIPS:
        h = r_header(k)
        data = background((150, 200), 1000.0 + 40 * k)
        add_star(data, h, star)
        hdu = fits.ImageHDU(data.astype(np.float32), header=h, name=name)
        hdu.header["BUNIT"] = "adu"
        hdus.append(hdu)
    bare = fits.ImageHDU(background((80, 100), 900.0).astype(np.float32), name="CHIP04")
    bare.header["BUNIT"] = "adu"
    hdus.append(bare)
    fits.HDUList(hdus).writeto(os.path.join(root, "camera", "cam_r.fits"), overwrite=True)

    primary = fits.PrimaryHDU()
    primary.header["FILTER"] = "g"
    hdus = [primary]
    for k, (name, shape, crpix, rot) in enumerate(G_CHIPS):
        h = chip_header(crpix, 0.55, rot, G_SIP[k])
        data = background(shape, 500.0 + 25 * k)
        add_star(data, h, star)
        hdu = fits.ImageHDU(data.astype(np.float32), header=h, name=name)
        hdu.header["BUNIT"] = "adu"
        hdus.append(hdu)
    fits.HDUList(hdus).writeto(os.path.join(root, "camera", "cam_g.fits"), overwrite=True)

    hdus = [fits.PrimaryHDU()] + [fits.ImageHDU(background((60, 80), 10.0 * k).astype(np.float32), name=f"BLIND{k}") for k in (1, 2)]
    fits.HDUList(hdus).writeto(os.path.join(root, "blind", "blind.fits"), overwrite=True)
    # scattered: two single-image bands of pointings 10 degrees apart, which no sensible canvas holds
    os.makedirs(os.path.join(root, "scattered"), exist_ok=True)
    for name, ra in (("scattered_a.fits", 150.0), ("scattered_b.fits", 160.0)):
        h = chip_header((50.5, 50.5), 1.0, 0.0, {})
        h["CRVAL1"] = ra
        fits.PrimaryHDU(background((100, 100), 100.0).astype(np.float32), header=h).writeto(os.path.join(root, "scattered", name), overwrite=True)
    print(json.dumps({"star": [float(star[0]), float(star[1])]}))


def canvas_wcs(cards):
    h = fits.Header()
    for key, value in cards.items():
        h[key] = value
    return WCS(h)


def locate(chips, sky):
    """Every chip holding the sky position, by astropy all_world2pix (origin 1): [(hdu, name, x, y)]."""
    found = []
    for (index, name, w, data) in chips:
        x, y = w.all_world2pix([[sky[0], sky[1]]], 1, tolerance=1e-12, maxiter=100)[0]
        ny, nx = data.shape
        if 0.5 <= x < nx + 0.5 and 0.5 <= y < ny + 0.5:
            found.append((index, name, float(x), float(y)))
    return found


def bilinear(data, x, y):
    """The documented canvas method on 1-based chip coordinates: bilinear where the four neighbours are finite."""
    fx, fy = x - 1.0, y - 1.0
    i0, j0 = int(np.floor(fx)), int(np.floor(fy))
    tx, ty = fx - i0, fy - j0
    q = data[j0:j0 + 2, i0:i0 + 2].astype(np.float64)
    return float((1 - tx) * (1 - ty) * q[0, 0] + tx * (1 - ty) * q[0, 1] + (1 - tx) * ty * q[1, 0] + tx * ty * q[1, 1])


def reference(root, header_json):
    cards = json.loads(header_json)
    cw = canvas_wcs(cards)
    out = {}
    for band, fname in (("r", "cam_r.fits"), ("g", "cam_g.fits")):
        chips = []
        with fits.open(os.path.join(root, "camera", fname)) as hl:
            for index, hdu in enumerate(hl):
                if hdu.data is None or "CTYPE1" not in hdu.header:
                    continue
                chips.append((index, hdu.name, WCS(hdu.header), hdu.data.astype(np.float64)))
        points = []
        for (index, name, w, data) in chips:
            ny, nx = data.shape
            for (x, y) in ((37.3, 51.8), ((nx + 1) / 2.0 + 0.27, (ny + 1) / 2.0 - 0.19), (nx - 10.4, ny - 7.6)):
                sky = w.all_pix2world([[x, y]], 1)[0]
                cx, cy = cw.all_world2pix([[sky[0], sky[1]]], 1)[0]
                # the reference chain, from the canvas position: canvas pixel -> sky -> chip pixel
                back = cw.all_pix2world([[cx, cy]], 1)[0]
                hit = locate(chips, back)
                assert len(hit) == 1 and hit[0][0] == index, (band, name, x, y, hit)
                _, _, hx, hy = hit[0]
                px, py = int(np.floor(hx + 0.5)), int(np.floor(hy + 0.5))
                points.append({"canvasX": float(cx), "canvasY": float(cy), "ra": float(back[0]), "dec": float(back[1]),
                               "hdu": index, "name": name, "x": hx, "y": hy, "px": px, "py": py,
                               "value": float(data[py - 1, px - 1])})
        # the chip corner (0.5, 0.5) where each outline starts, on the canvas
        corners = {}
        for (index, name, w, data) in chips:
            sky = w.all_pix2world([[0.5, 0.5]], 1)[0]
            corners[name] = [float(v) for v in cw.all_world2pix([[sky[0], sky[1]]], 1)[0]]
        out[band] = {"points": points, "corners": corners}

        # tile pixels: integer canvas pixels near each chip's centre, with the value the documented method gives
        pixels = []
        for (index, name, w, data) in chips:
            ny, nx = data.shape
            sky = w.all_pix2world([[(nx + 1) / 2.0 + 13.0, (ny + 1) / 2.0 - 9.0]], 1)[0]
            cx, cy = cw.all_world2pix([[sky[0], sky[1]]], 1)[0]
            for (dx, dy) in ((0, 0), (3, 2), (-5, 4)):
                X, Y = int(round(cx)) + dx, int(round(cy)) + dy
                hit = locate(chips, cw.all_pix2world([[X, Y]], 1)[0])
                assert len(hit) == 1 and hit[0][0] == index
                pixels.append({"canvasX": X, "canvasY": Y, "hdu": index, "value": bilinear(data, hit[0][2], hit[0][3])})
        out[band]["pixels"] = pixels

    # a gap: half-way between r CHIP01 and CHIP02 (10 px right of CHIP01's last column)
    with fits.open(os.path.join(root, "camera", "cam_r.fits")) as hl:
        r_chips = [(i, h.name, WCS(h.header), h.data) for i, h in enumerate(hl) if h.data is not None and "CTYPE1" in h.header]
        sky = WCS(hl["CHIP01"].header).all_pix2world([[210.5, 75.0]], 1)[0]
    gx, gy = cw.all_world2pix([[sky[0], sky[1]]], 1)[0]
    gap_sky = cw.all_pix2world([[gx, gy]], 1)[0]
    assert not locate(r_chips, gap_sky)
    out["gap"] = {"canvasX": float(gx), "canvasY": float(gy), "ra": float(gap_sky[0]), "dec": float(gap_sky[1]),
                  "pixelX": int(round(gx)), "pixelY": int(round(gy))}
    star = WCS(r_header(1)).all_pix2world([[60.3, 80.7]], 1)[0]
    sx, sy = cw.all_world2pix([[star[0], star[1]]], 1)[0]
    out["star"] = {"canvasX": float(sx), "canvasY": float(sy)}
    # the background under the star in each band (the formula the files were written with), for display limits
    for band, fname, chip, level in (("r", "cam_r.fits", "CHIP02", 1040.0), ("g", "cam_g.fits", "GCHIP1", 500.0)):
        with fits.open(os.path.join(root, "camera", fname)) as hl:
            x, y = WCS(hl[chip].header).all_world2pix([[star[0], star[1]]], 1, tolerance=1e-12)[0]
        i, j = x - 1, y - 1
        out["star"][band] = float(level + 0.3 * i + 0.2 * j + 3.0 * np.sin(i / 6.0) * np.cos(j / 9.0))
    # finite pixels of every image HDU of each band, chips without WCS included: the band-wide statistics' count
    out["finite"] = {}
    for band, fname in (("r", "cam_r.fits"), ("g", "cam_g.fits")):
        with fits.open(os.path.join(root, "camera", fname)) as hl:
            out["finite"][band] = int(sum(np.count_nonzero(np.isfinite(h.data)) for h in hl if h.data is not None))
    # the canvas centre on the sky and the canvas pixel scale, from the canvas header alone
    width, height = int(cards["NAXIS1"]), int(cards["NAXIS2"])
    centre = cw.all_pix2world([[(1 + width) / 2.0, (1 + height) / 2.0]], 1)[0]
    out["canvas"] = {"width": width, "height": height, "ra": float(centre[0]), "dec": float(centre[1]),
                     "scaleArcsec": float(proj_plane_pixel_scales(cw.celestial)[1] * 3600.0)}
    print(json.dumps(out))


if __name__ == "__main__":
    if sys.argv[1] == "write":
        write(sys.argv[2])
    else:
        reference(sys.argv[2], sys.argv[3])
