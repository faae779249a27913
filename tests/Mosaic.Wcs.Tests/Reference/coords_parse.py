# Reference for Mosaic.Wcs.Coordinates: astropy's SkyCoord string parsing (python3-astropy).
# stdin: one "units<TAB>text" per line; units is "hourangle" (sexagesimal RA in hours) or "deg".
# stdout: "ra dec" in degrees with 17 significant digits, one per input line.
import sys
from astropy.coordinates import SkyCoord
import astropy.units as u

for line in sys.stdin:
    line = line.rstrip("\n")
    if not line:
        continue
    units, text = line.split("\t", 1)
    ra_unit = u.hourangle if units == "hourangle" else u.deg
    c = SkyCoord(text, unit=(ra_unit, u.deg), frame="icrs")
    print("%.17g %.17g" % (c.ra.deg, c.dec.deg))
