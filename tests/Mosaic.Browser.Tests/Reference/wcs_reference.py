"""Sky coordinates of FITS pixels with astropy (Debian's python3-astropy), independently of Mosaic, for the browser tests.

Pixel coordinates in and out are FITS 1-based (origin=1 in astropy.wcs). Sky positions are ICRS degrees: the
header's own frame (RADESYS/EQUINOX, read by astropy.wcs.utils.wcs_to_celestial_frame) is converted to ICRS with
astropy.coordinates, and Galactic l, b come from SkyCoord.galactic (IAU 1958 definition as astropy implements it).
All pixel <-> sky steps use WCS.all_pix2world / all_world2pix, which include SIP distortion.

Commands (each prints one JSON object):
  pix2world FILE HDU X Y [X Y ...]   ra, dec, l, b of each pixel position
  world2pix FILE HDU RA DEC [RA DEC ...]
                                     FITS pixel position (x, y) of each ICRS position, with the image's size
  local FILE HDU X Y                 north and east as unit vectors in pixel axes at (X, Y), and the pixel scale
                                     (arcsec per pixel, sqrt |det J| of pixel -> local sky offsets) there
"""
import json
import math
import sys
import warnings

try:
    import numpy as np
    from astropy.io import fits
    from astropy.wcs import WCS, FITSFixedWarning
    from astropy.wcs.utils import wcs_to_celestial_frame
    from astropy.coordinates import SkyCoord
    import astropy.units as u
except ImportError as error:  # the C# side turns this into a test failure naming the package
    print(json.dumps({"error": f"python3-astropy / python3-numpy missing: {error}"}))
    sys.exit(3)

warnings.simplefilter("ignore", FITSFixedWarning)


def load(path, hdu):
    with fits.open(path, memmap=False) as hdus:
        header = hdus[hdu].header.copy()
    wcs = WCS(header)
    return wcs, wcs_to_celestial_frame(wcs)


def to_icrs(wcs, frame, xs, ys):
    lon, lat = wcs.all_pix2world(np.asarray(xs, dtype=float), np.asarray(ys, dtype=float), 1)
    return SkyCoord(lon * u.deg, lat * u.deg, frame=frame).icrs


def to_pixel(wcs, frame, ra, dec):
    native = SkyCoord(np.asarray(ra) * u.deg, np.asarray(dec) * u.deg, frame="icrs").transform_to(frame)
    lon = native.spherical.lon.deg
    lat = native.spherical.lat.deg
    # quiet: a position far off a chip (checking that it is on none) need not converge to 1e-10 to be plainly off it.
    return wcs.all_world2pix(lon, lat, 1, tolerance=1e-10, maxiter=100, quiet=True)


def pix2world(path, hdu, coordinates):
    wcs, frame = load(path, hdu)
    xs, ys = coordinates[0::2], coordinates[1::2]
    icrs = to_icrs(wcs, frame, xs, ys)
    galactic = icrs.galactic
    points = []
    for i, (x, y) in enumerate(zip(xs, ys)):
        points.append({"x": x, "y": y, "ra": float(icrs.ra.deg[i]), "dec": float(icrs.dec.deg[i]),
                       "l": float(galactic.l.deg[i]), "b": float(galactic.b.deg[i])})
    return {"points": points}


def world2pix(path, hdu, coordinates):
    wcs, frame = load(path, hdu)
    ras, decs = coordinates[0::2], coordinates[1::2]
    xs, ys = to_pixel(wcs, frame, ras, decs)
    width, height = int(wcs.pixel_shape[0]), int(wcs.pixel_shape[1])
    points = [{"ra": ra, "dec": dec, "x": float(x), "y": float(y)} for ra, dec, x, y in zip(ras, decs, xs, ys)]
    return {"width": width, "height": height, "points": points}


def local(path, hdu, x, y):
    wcs, frame = load(path, hdu)
    centre = to_icrs(wcs, frame, [x], [y])
    ra, dec = float(centre.ra.deg[0]), float(centre.dec.deg[0])
    step = 1.0 / 3600  # one arcsecond: small against the field, large against rounding

    def direction(dra, ddec):
        px, py = to_pixel(wcs, frame, [ra + dra], [dec + ddec])
        dx, dy = float(px[0]) - x, float(py[0]) - y
        norm = math.hypot(dx, dy)
        return {"dx": dx / norm, "dy": dy / norm}

    north = direction(0.0, step)
    east = direction(step / math.cos(math.radians(dec)), 0.0)

    # Central differences of pixel -> sky, as offsets on the sky (RA scaled by cos Dec) in arcsec.
    h = 0.5
    around = to_icrs(wcs, frame, [x + h, x - h, x, x], [y, y, y + h, y - h])
    offsets = [centre[0].spherical_offsets_to(around[i]) for i in range(4)]
    east_x = (offsets[0][0] - offsets[1][0]).to_value(u.arcsec) / (2 * h)
    north_x = (offsets[0][1] - offsets[1][1]).to_value(u.arcsec) / (2 * h)
    east_y = (offsets[2][0] - offsets[3][0]).to_value(u.arcsec) / (2 * h)
    north_y = (offsets[2][1] - offsets[3][1]).to_value(u.arcsec) / (2 * h)
    scale = math.sqrt(abs(east_x * north_y - east_y * north_x))
    return {"ra": ra, "dec": dec, "north": north, "east": east, "pixelScale": scale}


COMMANDS = {
    "pix2world": lambda a: pix2world(a[0], int(a[1]), [float(v) for v in a[2:]]),
    "world2pix": lambda a: world2pix(a[0], int(a[1]), [float(v) for v in a[2:]]),
    "local": lambda a: local(a[0], int(a[1]), float(a[2]), float(a[3])),
}

if __name__ == "__main__":
    print(json.dumps(COMMANDS[sys.argv[1]](sys.argv[2:])))
