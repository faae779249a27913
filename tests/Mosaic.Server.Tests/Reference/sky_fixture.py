"""Writes the sky-coordinate test fields with astropy.io.fits and reports what astropy.wcs (wcslib) and
astropy.coordinates make of them. Usage: sky_fixture.py DATA_DIR; prints one JSON document."""
import json, os, sys
import numpy as np
import erfa
from astropy.io import fits
from astropy.wcs import WCS
from astropy.wcs.utils import proj_plane_pixel_scales
from astropy.coordinates import SkyCoord
import astropy.units as u

root = sys.argv[1]
rng = np.random.default_rng(11)


def celestial(crval, crpix, scale_arcsec, rotation_deg=0.0, ctype=("RA---TAN", "DEC--TAN"), radesys="ICRS"):
    h = fits.Header()
    h["CTYPE1"], h["CTYPE2"] = ctype
    h["CRVAL1"], h["CRVAL2"] = crval
    h["CRPIX1"], h["CRPIX2"] = crpix
    s = scale_arcsec / 3600.0
    r = np.radians(rotation_deg)
    # RA increases to the left (east left, north up before rotation)
    h["CD1_1"] = -s * np.cos(r)
    h["CD1_2"] = s * np.sin(r)
    h["CD2_1"] = s * np.sin(r)
    h["CD2_2"] = s * np.cos(r)
    if radesys:
        h["RADESYS"] = radesys
    return h


def write(name, header, shape, primary_only=True):
    data = rng.normal(100.0, 5.0, size=shape).astype(np.float32)
    hdu = fits.PrimaryHDU(data, header=header)
    hdu.header["BUNIT"] = "adu"
    hdu.writeto(os.path.join(root, name), overwrite=True)


fields = {}
# tan: rotated TAN, CRPIX at the image centre so the centre pixel scale is the CD matrix's
fields["tan"] = (celestial((150.1, -2.3), (200.5, 150.5), 3.0, rotation_deg=30.0), (300, 400))
# sip: TAN-SIP with a visible distortion (A/B only: astropy inverts by iteration, as we do)
sip = celestial((210.25, 35.2), (180.0, 140.0), 1.5, rotation_deg=-12.0, ctype=("RA---TAN-SIP", "DEC--TAN-SIP"))
sip["A_ORDER"] = 3
sip["B_ORDER"] = 3
for key, value in {"A_2_0": 2.1e-5, "A_1_1": -1.3e-5, "A_0_2": 0.8e-5, "A_3_0": 4.0e-8, "A_1_2": -2.0e-8,
                   "B_2_0": -0.9e-5, "B_1_1": 1.7e-5, "B_0_2": 2.4e-5, "B_0_3": 3.0e-8, "B_2_1": 1.5e-8}.items():
    sip[key] = value
fields["sip"] = (sip, (300, 400))
# wrap: RA = 0 runs through the image
fields["wrap"] = (celestial((0.05, 10.0), (200.5, 150.5), 6.0, rotation_deg=8.0), (300, 400))
# pole: the north celestial pole lies inside the image
fields["pole"] = (celestial((45.0, 89.9), (200.5, 200.5), 3.0, rotation_deg=0.0), (400, 400))
# galactic axes: probes still answer in ICRS
fields["galactic"] = (celestial((30.0, 5.0), (200.5, 150.5), 2.0, rotation_deg=0.0, ctype=("GLON-TAN", "GLAT-TAN"), radesys=None), (300, 400))
# FK5 of another equinox: probes answer in ICRS through precession and the frame bias
fk5 = celestial((83.6, 22.0), (200.5, 150.5), 2.0, rotation_deg=5.0, radesys="FK5")
fk5["EQUINOX"] = 1975.0
fields["fk5"] = (fk5, (300, 400))
for name, (header, shape) in fields.items():
    write(name + ".fits", header, shape)
fk4 = celestial((83.6, 22.0), (50.5, 50.5), 2.0, radesys="FK4")
fk4["EQUINOX"] = 1950.0
write("fk4.fits", fk4, (100, 100))

# no WCS at all, and a projection the server does not support
write("plain.fits", fits.Header(), (100, 120))
odd = celestial((10.0, 20.0), (50.5, 50.5), 1.0, ctype=("RA---XPH", "DEC--XPH"))
write("odd.fits", odd, (100, 100))

# camera: four 200 x 200 chips with their own CRVAL, 20 arcsec gaps between them, around a field centre
centre = WCS(celestial((210.3, 35.2), (0.0, 0.0), 1.0))
chips = []
chip_headers = []
for k, (ox, oy) in enumerate([(-110, -110), (110, -110), (-110, 110), (110, 110)], start=1):
    # the chip centre in the field's tangent plane, 1 arcsec per unit (x grows to the west, like pixel x)
    ra, dec = centre.all_pix2world([[ox, oy]], 0)[0]
    h = celestial((float(ra), float(dec)), (100.5, 100.5), 1.0, rotation_deg=0.0)
    h["EXTNAME"] = f"CHIP{k}"
    chip_headers.append(h)
    chips.append(fits.ImageHDU(rng.normal(10.0 * k, 1.0, size=(200, 200)).astype(np.float32), header=h))
fits.HDUList([fits.PrimaryHDU()] + chips).writeto(os.path.join(root, "camera.fits"), overwrite=True)


def sky(w, x, y):
    ra, dec = w.all_pix2world([[x, y]], 1)[0]
    return float(ra), float(dec)


def icrs_of(w, x, y, frame="icrs"):
    lon, lat = w.all_pix2world([[x, y]], 1)[0]
    if frame == "fk5":
        # astropy's SkyCoord precesses FK5 by IAU 2006; Mosaic uses IAU 1976 (Lieske et al. 1977), which ERFA's
        # pmat76 gives (the rotation from J2000 to the date), so precess with it and let astropy do FK5 J2000 -> ICRS.
        jd = 2451545.0 + (w.wcs.equinox - 2000.0) * 365.25
        a, d = np.radians(lon), np.radians(lat)
        v = erfa.pmat76(jd, 0.0).T @ np.array([np.cos(d) * np.cos(a), np.cos(d) * np.sin(a), np.sin(d)])
        lon, lat = np.degrees(np.arctan2(v[1], v[0])) % 360, np.degrees(np.arcsin(v[2]))
        c = SkyCoord(lon * u.deg, lat * u.deg, frame="fk5", equinox="J2000").icrs
    else:
        c = SkyCoord(lon * u.deg, lat * u.deg, frame=frame).icrs
    g = c.galactic
    return {"ra": float(c.ra.deg), "dec": float(c.dec.deg), "l": float(g.l.deg), "b": float(g.b.deg),
            "raText": c.ra.to_string(unit=u.hourangle, sep=":", precision=3, pad=True),
            "decText": c.dec.to_string(unit=u.deg, sep=":", precision=2, pad=True, alwayssign=True)}


def pix(w, ra, dec):
    x, y = w.all_world2pix([[ra, dec]], 1, tolerance=1e-12, maxiter=200)[0]
    return float(x), float(y)


out = {"probes": {}, "skyProbes": {}, "scales": {}, "views": {}}
wcs = {name: WCS(header) for name, (header, _) in fields.items()}
# probe by pixel: astropy all_pix2world (origin 1), then SkyCoord to ICRS and Galactic
for name, frame in (("tan", "icrs"), ("sip", "icrs"), ("galactic", "galactic"), ("pole", "icrs"), ("fk5", "fk5")):
    out["probes"][name] = [dict(x=x, y=y, **icrs_of(wcs[name], x, y, frame)) for (x, y) in [(1.0, 1.0), (37.25, 210.75), (200.5, 150.5), (333.0, 12.4)]]

# probe by sky position: a position, and where astropy all_world2pix puts it
for name in ("tan", "sip"):
    ra, dec = sky(wcs[name], 123.4, 56.7)
    x, y = pix(wcs[name], ra, dec)
    text = SkyCoord(ra * u.deg, dec * u.deg).to_string("hmsdms", sep=":", precision=4)
    parsed = SkyCoord(text, unit=(u.hourangle, u.deg))
    tx, ty = pix(wcs[name], float(parsed.ra.deg), float(parsed.dec.deg))
    hms = SkyCoord(ra * u.deg, dec * u.deg).to_string("hmsdms", precision=3)   # "10h00m43.623s -02d29m27.650s"
    hparsed = SkyCoord(hms, unit=(u.hourangle, u.deg))
    hx, hy = pix(wcs[name], float(hparsed.ra.deg), float(hparsed.dec.deg))
    out["skyProbes"][name] = {"ra": ra, "dec": dec, "x": x, "y": y, "text": text, "textX": tx, "textY": ty,
                              "hms": hms, "hmsX": hx, "hmsY": hy}

cam = {}
chip_wcs = [WCS(h) for h in chip_headers]
for k in range(4):
    ra, dec = sky(chip_wcs[k], 60.3 + 20 * k, 140.9 - 15 * k)
    x, y = pix(chip_wcs[k], ra, dec)
    text = SkyCoord(ra * u.deg, dec * u.deg).to_string("hmsdms", sep=" ", precision=4)
    parsed = SkyCoord(text, unit=(u.hourangle, u.deg))
    tx, ty = pix(chip_wcs[k], float(parsed.ra.deg), float(parsed.dec.deg))
    cam[f"CHIP{k + 1}"] = {"hdu": k + 1, "ra": ra, "dec": dec, "x": x, "y": y, "text": text, "textX": tx, "textY": ty}


def on_no_chip(ra, dec):
    for w in chip_wcs:
        x, y = pix(w, ra, dec)
        if 0.5 <= x < 200.5 and 0.5 <= y < 200.5:
            return False
    return True


gap = sky(centre, 1 + 0.0, 1 + 50.0)      # 50 arcsec up the vertical gap at the field's middle
off = sky(centre, 1 + 900.0, 1 + 0.0)     # 15 arcmin west of the field
assert on_no_chip(*gap) and on_no_chip(*off)
cam["gap"] = {"ra": gap[0], "dec": gap[1]}
cam["off"] = {"ra": off[0], "dec": off[1]}
out["camera"] = cam

# pixel scales: astropy.wcs.utils.proj_plane_pixel_scales (arcsec), and the local scale at the image centre by
# central differences of all_pix2world on the unit sphere
def local_frame(w, x, y, h=0.5):
    def vec(ra, dec):
        a, d = np.radians(ra), np.radians(dec)
        return np.array([np.cos(d) * np.cos(a), np.cos(d) * np.sin(a), np.sin(d)])
    ra, dec = sky(w, x, y)
    a, d = np.radians(ra), np.radians(dec)
    east = np.array([-np.sin(a), np.cos(a), 0.0])
    north = np.array([-np.sin(d) * np.cos(a), -np.sin(d) * np.sin(a), np.cos(d)])
    jx = (vec(*sky(w, x + h, y)) - vec(*sky(w, x - h, y))) / (2 * h)
    jy = (vec(*sky(w, x, y + h)) - vec(*sky(w, x, y - h))) / (2 * h)
    J = np.array([[east @ jx, east @ jy], [north @ jx, north @ jy]])
    inv = np.linalg.inv(J)
    n = inv @ np.array([0.0, 1.0]); e = inv @ np.array([1.0, 0.0])
    c = SkyCoord(ra * u.deg, dec * u.deg)
    return {"x": x, "y": y, "ra": ra, "dec": dec,
            "raText": c.ra.to_string(unit=u.hourangle, sep=":", precision=3, pad=True),
            "decText": c.dec.to_string(unit=u.deg, sep=":", precision=2, pad=True, alwayssign=True),
            "north": list(map(float, n / np.linalg.norm(n))), "east": list(map(float, e / np.linalg.norm(e))),
            "scale": float(np.sqrt(abs(np.linalg.det(J))) * 206264.80624709636)}


for name, (header, shape) in fields.items():
    out["scales"][name] = {"planeScales": [float(s) * 3600 for s in proj_plane_pixel_scales(wcs[name])],
                           "centre": local_frame(wcs[name], (shape[1] + 1) / 2, (shape[0] + 1) / 2)}

# view boxes the /sky tests ask for, with the local frame at each box centre
views = {"tan": ("tan", (-50.0, -30.0, 450.0, 330.0, 1000, 720)), "wrap": ("wrap", (0.5, 0.5, 400.5, 300.5, 800, 600)),
         "pole": ("pole", (0.5, 0.5, 400.5, 400.5, 800, 800)), "sip": ("sip", (20.0, 10.0, 380.0, 290.0, 720, 560)),
         # the pole 50 px above the top edge: meridians fan out from just outside the view
         "poleNear": ("pole", (60.5, 100.5, 340.5, 270.5, 840, 510))}
for view, (name, (x0, y0, x1, y1, wd, ht)) in views.items():
    out["views"][view] = {"field": name, "box": [x0, y0, x1, y1, wd, ht], "frame": local_frame(wcs[name], (x0 + x1) / 2, (y0 + y1) / 2)}
pole_x, pole_y = pix(wcs["pole"], 0.0, 90.0)
out["views"]["pole"]["poleAt"] = [pole_x, pole_y]
print(json.dumps(out))
