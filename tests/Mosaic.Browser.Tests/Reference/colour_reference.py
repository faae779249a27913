"""Colour-composite references for the browser tests, computed with Debian's python3-astropy and python3-numpy.

`field DIR` writes a synthetic three-band field with astropy.io.fits: three files of one 128 x 128 float32 image
extension each (EXTNAME SKY), Gaussian noise around a flat sky, and three square sources, each bright in one
band only; one band has a square of NaN (masked) pixels. Prints the sources' centres (FITS 1-based x, y).

`lupton DIR RED GREEN BLUE Q RANGE MIN_R MIN_G MIN_B X Y` prints the 8-bit colour
astropy.visualization.make_lupton_rgb (Lupton et al. 2004) gives pixel (X, Y) of the three bands named.
"""
import json
import os
import sys

try:
    import numpy as np
    from astropy.io import fits
    from astropy.visualization import make_lupton_rgb
except ImportError as error:  # the C# side turns this into a test failure naming the package
    print(json.dumps({"error": f"python3-astropy / python3-numpy missing: {error}"}))
    sys.exit(3)

SIZE = 128
SKY = 10.0
NOISE = 2.0
BRIGHT = 400.0
HALF = 5
# Which band each source is bright in, and where (FITS 1-based centre).
SOURCES = {"a-650nm": (32, 36), "b-450nm": (96, 92), "c-550nm": (32, 92)}
MASK_BAND, MASK_CENTRE = "c-550nm", (96, 32)


def square(data, centre, value):
    x, y = centre
    data[y - 1 - HALF:y + HALF, x - 1 - HALF:x + HALF] = value


def field(folder):
    os.makedirs(folder, exist_ok=True)
    rng = np.random.default_rng(20261201)
    for band, centre in SOURCES.items():
        data = (SKY + NOISE * rng.standard_normal((SIZE, SIZE))).astype(np.float32)
        y0, x0 = centre[1] - 1, centre[0] - 1
        data[y0 - HALF:y0 + HALF + 1, x0 - HALF:x0 + HALF + 1] += BRIGHT
        if band == MASK_BAND:
            square(data, MASK_CENTRE, np.nan)
        image = fits.ImageHDU(data=data, name="SKY")
        image.header["FILTER"] = band
        image.header["BUNIT"] = "adu"
        fits.HDUList([fits.PrimaryHDU(), image]).writeto(os.path.join(folder, f"{band}.fits"), overwrite=True)
    return {"sources": {band: {"x": c[0], "y": c[1]} for band, c in SOURCES.items()},
            "masked": {"band": MASK_BAND, "x": MASK_CENTRE[0], "y": MASK_CENTRE[1]}, "size": SIZE}


def read(folder, band):
    with fits.open(os.path.join(folder, f"{band}.fits"), memmap=False) as hdus:
        return hdus[1].data.astype(np.float64)


def lupton(folder, red, green, blue, q, stretch, mins, x, y):
    images = [read(folder, band) for band in (red, green, blue)]
    # make_lupton_rgb works on finite numbers; the masked colour is the viewer's own, so NaN is left out here.
    images = [np.nan_to_num(image, nan=0.0) for image in images]
    rgb = make_lupton_rgb(*images, minimum=mins, stretch=stretch, Q=q)
    r, g, b = (int(v) for v in rgb[y - 1, x - 1])
    return {"r": r, "g": g, "b": b}


if __name__ == "__main__":
    command, args = sys.argv[1], sys.argv[2:]
    if command == "field":
        print(json.dumps(field(args[0])))
    elif command == "lupton":
        print(json.dumps(lupton(args[0], args[1], args[2], args[3], float(args[4]), float(args[5]),
                                [float(v) for v in args[6:9]], int(args[9]), int(args[10]))))
    else:
        raise SystemExit(f"unknown command {command}")
