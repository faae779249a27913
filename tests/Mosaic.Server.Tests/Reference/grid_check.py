"""Checks grid lines served by /sky against astropy.wcs (wcslib). Reads JSON on stdin:
{"fields": [{"file": path, "hdu": n, "lines": [{"axis": "ra"|"dec", "value": deg, "label": text,
"segments": [[[x, y], ...], ...]}]}]}. For every point it reports the sky position astropy gives (all_pix2world,
origin 1); for every pair of consecutive points, the pixel (all_world2pix) of the line's point halfway between
them in the line's running coordinate; and the value astropy.coordinates.Angle reads from each label."""
import json, sys
import numpy as np
from astropy.io import fits
from astropy.wcs import WCS
from astropy.coordinates import Angle
import astropy.units as u

request = json.load(sys.stdin)
answer = []
for field in request["fields"]:
    with fits.open(field["file"]) as f:
        w = WCS(f[field["hdu"]].header)
    lines = []
    for line in field["lines"]:
        segments = []
        for seg in line["segments"]:
            pts = np.array(seg, dtype=float)
            world = w.all_pix2world(pts, 1)
            if line["axis"] == "ra":
                dec = world[:, 1]
                mids = np.column_stack([np.full(len(pts) - 1, line["value"]), (dec[:-1] + dec[1:]) / 2])
            else:
                ra = np.unwrap(np.radians(world[:, 0]))
                mid_ra = np.degrees((ra[:-1] + ra[1:]) / 2) % 360
                mids = np.column_stack([mid_ra, np.full(len(pts) - 1, line["value"])])
            mid_pix = w.all_world2pix(mids, 1, tolerance=1e-12, maxiter=200) if len(mids) else np.zeros((0, 2))
            segments.append({"world": world.tolist(), "midPixels": mid_pix.tolist()})
        unit = u.hourangle if line["axis"] == "ra" else u.deg
        lines.append({"segments": segments, "labelDegrees": float(Angle(line["label"], unit=unit).degree)})
    answer.append(lines)
print(json.dumps(answer))
