# Reference frames from astropy (Debian python3-astropy): astropy.wcs reads the header's frame, SkyCoord moves it to
# ICRS; ERFA's pmat76 gives the IAU 1976 precession alone.
# stdin: {"cards": {keyword: value}, "pixels": [[x, y], ...], "icrs": [[ra, dec], ...]}, pixels 1-based.
# stdout: {"frame": name, "equinox": Julian year or null, "icrs": [[ra, dec] or null], "pixels": [[x, y] or null],
#          "icrs76": [[ra, dec] or null] (FK5 only: native coordinates precessed to J2000 by pmat76, then to ICRS)}.
import json
import sys
import warnings

import erfa
import numpy as np
import astropy.units as u
from astropy.coordinates import FK5, SkyCoord
from astropy.io import fits
from astropy.wcs import WCS
from astropy.wcs.utils import wcs_to_celestial_frame

warnings.simplefilter("ignore")
request = json.load(sys.stdin)
header = fits.Header()
for key, value in request["cards"].items():
    header[key] = value
wcs = WCS(header)
frame = wcs_to_celestial_frame(wcs)
name = frame.name
equinox = float(frame.equinox.jyear) if name == "fk5" else None


def rows(a, b):
    return [None if not (np.isfinite(p) and np.isfinite(q)) else [float(p), float(q)] for p, q in zip(a, b)]


out = {"frame": name, "equinox": equinox}
pixels = np.array(request.get("pixels") or [], dtype=float).reshape(-1, 2)
icrs = np.array(request.get("icrs") or [], dtype=float).reshape(-1, 2)
with np.errstate(all="ignore"):
    if len(pixels):
        sky = wcs.pixel_to_world(pixels[:, 0] - 1, pixels[:, 1] - 1).icrs
        out["icrs"] = rows(sky.ra.deg, sky.dec.deg)
        if name == "fk5":
            native = wcs.all_pix2world(pixels, 1)
            lon, lat = np.radians(native[:, 0]), np.radians(native[:, 1])
            v = np.array([np.cos(lat) * np.cos(lon), np.cos(lat) * np.sin(lon), np.sin(lat)])
            p = erfa.pmat76(2451545.0 + (equinox - 2000.0) * 365.25, 0.0)
            w = p.T @ v
            j2000 = SkyCoord(np.degrees(np.arctan2(w[1], w[0])) * u.deg, np.degrees(np.arcsin(w[2])) * u.deg,
                             frame=FK5(equinox="J2000")).icrs
            out["icrs76"] = rows(j2000.ra.deg, j2000.dec.deg)
    else:
        out["icrs"] = []
    if len(icrs):
        px, py = wcs.world_to_pixel(SkyCoord(icrs[:, 0] * u.deg, icrs[:, 1] * u.deg, frame="icrs"))
        out["pixels"] = rows(np.asarray(px) + 1, np.asarray(py) + 1)
    else:
        out["pixels"] = []
print(json.dumps(out))
