# Reference for Mosaic.Wcs.Coordinates: astropy's own frame transforms (python3-astropy).
# stdin: one "frame lon lat" per line, frame being icrs, galactic, fk5 (J2000) or icrs2fk5.
# stdout: the transformed "lon lat" in degrees with 17 significant digits, one per input line.
import sys
import numpy as np
from astropy.coordinates import SkyCoord, FK5
import astropy.units as u

for line in sys.stdin:
    parts = line.split()
    if not parts:
        continue
    kind, lon, lat = parts[0], float(parts[1]), float(parts[2])
    if kind == "icrs":
        c = SkyCoord(lon * u.deg, lat * u.deg, frame="icrs").galactic
        out = (c.l.deg, c.b.deg)
    elif kind == "galactic":
        c = SkyCoord(l=lon * u.deg, b=lat * u.deg, frame="galactic").icrs
        out = (c.ra.deg, c.dec.deg)
    elif kind == "icrs2fk5":
        c = SkyCoord(lon * u.deg, lat * u.deg, frame="icrs").transform_to(FK5(equinox="J2000"))
        out = (c.ra.deg, c.dec.deg)
    elif kind == "fk5":
        c = SkyCoord(lon * u.deg, lat * u.deg, frame=FK5(equinox="J2000")).icrs
        out = (c.ra.deg, c.dec.deg)
    else:
        raise SystemExit("unknown kind " + kind)
    print("%.17g %.17g" % out)
