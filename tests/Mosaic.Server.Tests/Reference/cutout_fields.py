"""Writes the cutout test fields with astropy.io.fits (Debian python3-astropy) and fpack (libcfitsio-bin).
Usage: make.py DATA_DIR WORK_DIR; prints JSON."""
import json, os, subprocess, sys
import numpy as np
from astropy.io import fits

data_dir, work = sys.argv[1], sys.argv[2]
rng = np.random.default_rng(7)

def wcs_cards(h, crpix, sip):
    s = 0.4 / 3600.0
    r = np.radians(20.0)
    h["CTYPE1"], h["CTYPE2"] = ("RA---TAN-SIP", "DEC--TAN-SIP") if sip else ("RA---TAN", "DEC--TAN")
    h["CRVAL1"], h["CRVAL2"] = 33.3, -12.7
    h["CRPIX1"], h["CRPIX2"] = crpix
    h["CD1_1"], h["CD1_2"] = -s * np.cos(r), s * np.sin(r)
    h["CD2_1"], h["CD2_2"] = s * np.sin(r), s * np.cos(r)
    h["RADESYS"] = "ICRS"
    if sip:
        h["A_ORDER"] = 3
        h["B_ORDER"] = 3
        for k, v in {"A_2_0": 3.1e-5, "A_1_1": -1.1e-5, "A_0_2": 0.9e-5, "A_3_0": 5.0e-8, "B_2_0": -1.2e-5,
                     "B_1_1": 2.0e-5, "B_0_2": 2.2e-5, "B_0_3": 4.0e-8}.items():
            h[k] = v

def chips(path, with_extras):
    w, hgt = 120, 90
    counts = rng.integers(1000, 65000, size=(hgt, w)).astype(np.uint16)
    counts[5, 7] = 0      # stored -32768 under BZERO 32768: BLANK below
    h1 = fits.Header()
    h1["EXTNAME"] = "CHIP1"
    h1["BUNIT"] = "adu"
    wcs_cards(h1, (50.5, 40.2), sip=True)
    h1["LTV1"] = -10.0
    h1["DATE"] = "2001-01-01T00:00:00"
    chip1 = fits.ImageHDU(counts, header=h1)          # uint16 -> BITPIX 16, BZERO 32768
    flux = rng.normal(100.0, 5.0, size=(hgt, w)).astype(np.float32)
    flux[10, 11] = np.nan
    h2 = fits.Header()
    h2["EXTNAME"] = "CHIP2"
    h2["BUNIT"] = "adu"
    wcs_cards(h2, (50.5 - 124.0, 40.2), sip=False)
    if with_extras:
        h2["HIERARCH PIPELINE STEP NAME"] = "flatten"
        h2["EXPLEN"] = (1.5e-05, "a comment long enough that a reformatted value could need more room ok")
    chip2 = fits.ImageHDU(flux, header=h2)
    fits.HDUList([fits.PrimaryHDU(), chip1, chip2]).writeto(path, overwrite=True, checksum=True)
    with fits.open(path, mode="update", do_not_scale_image_data=True) as f:
        f[1].header["BLANK"] = -32768
        f[1].add_checksum()

chips(os.path.join(data_dir, "chips.fits"), True)
source = os.path.join(work, "packsrc.fits")
chips(source, False)
packed = os.path.join(data_dir, "packed.fits.fz")
with open(packed, "wb") as out:
    subprocess.run(["fpack", "-S", source], stdout=out, check=True)
with fits.open(packed) as f:
    kinds = [type(h).__name__ for h in f]
print(json.dumps({"kinds": kinds}))
