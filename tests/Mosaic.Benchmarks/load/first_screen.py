"""Start to first screen: launches the server on a data folder with an empty cache and times, from the launch,
until every tile of the first screen answers 200 (polled with 4 connections; the server answers 503 while the
pyramid is built). The first screen is the whole frame fitted to a 1280 x 800 view, as the page opens a field:
Leaflet's fit with 16 px padding, zoom snapped down to a quarter level, tiles of the nearest whole zoom.

  first_screen.py SERVER_DLL CONTENT_ROOT DATA_FOLDER CACHE_FOLDER FIELD PORT CPUS

Also: numpy + astropy + Pillow making the same screen from the FITS file (baseline_screen in this file).
Debian's /usr/bin/python3.
"""
import json
import math
import os
import shutil
import subprocess
import sys
import time
import urllib.error
import urllib.request
from concurrent.futures import ThreadPoolExecutor

VIEW_WIDTH, VIEW_HEIGHT, PADDING, SNAP = 1280, 800, 16, 0.25


def screen_tiles(width, height, max_zoom):
    """The tile zoom and (x, y) of every tile of the fitted view."""
    scale = min((VIEW_WIDTH - 2 * PADDING) / width, (VIEW_HEIGHT - 2 * PADDING) / height)
    zoom = max_zoom + math.floor(math.log2(scale) / SNAP) * SNAP
    z = max(0, min(max_zoom, round(zoom)))
    shrink = 1 << (max_zoom - z)
    across, down = math.ceil(math.ceil(width / shrink) / 256), math.ceil(math.ceil(height / shrink) / 256)
    return z, [(x, y) for y in range(down) for x in range(across)]


def get(url, timeout=10):
    try:
        with urllib.request.urlopen(url, timeout=timeout) as response:
            return response.status, response.read()
    except urllib.error.HTTPError as e:
        return e.code, b""
    except OSError:
        return 0, b""


def main():
    dll, content_root, data, cache, field, port, cpus = sys.argv[1:8]
    base = f"http://127.0.0.1:{port}"
    shutil.rmtree(cache, ignore_errors=True)
    log = open(os.path.join(os.path.dirname(cache), f"first-screen-{port}.log"), "w")
    start = time.monotonic()
    server = subprocess.Popen(["taskset", "-c", cpus, "dotnet", dll, "--contentRoot", content_root, "--data", data,
                               "--cache", cache, "--state", cache + "-state", "--urls", base], stdout=log, stderr=log)
    try:
        listing = None
        while listing is None:
            status, body = get(f"{base}/api/fields/{field}", timeout=2)
            if status == 200:
                listing = json.loads(body)
            elif time.monotonic() - start > 60:
                sys.exit("first_screen.py: the server did not answer within 60 s")
            else:
                time.sleep(0.01)
        answered = time.monotonic() - start
        hdu = listing["hdus"][0] if listing.get("hdus") else listing["bands"][0]["hdus"][0]
        band = listing["bands"][0]
        z, tiles = screen_tiles(hdu["width"], hdu["height"], hdu["maxZoom"])
        query = f"band={band['name']}&hdu={hdu['index']}&v={band['version']}"
        pending = {(x, y) for x, y in tiles}
        with ThreadPoolExecutor(4) as pool:
            while pending:
                batch = sorted(pending)
                for (x, y), (status, _) in zip(batch, pool.map(lambda t: get(f"{base}/tiles/{field}/{z}/{t[0]}/{t[1]}.png?{query}"), batch)):
                    if status == 200:
                        pending.discard((x, y))
                    elif status not in (503, 0):
                        sys.exit(f"first_screen.py: tile {z}/{x}/{y} answered {status}")
                if pending:
                    if time.monotonic() - start > 600:
                        sys.exit("first_screen.py: no first screen within 600 s")
                    time.sleep(0.02)
        done = time.monotonic() - start
        peak = 0
        with open(f"/proc/{server.pid}/status") as status_file:
            for line in status_file:
                if line.startswith("VmHWM:"):
                    peak = int(line.split()[1]) // 1024
        print(f"FIGURE seconds={done:.2f} api_answered_s={answered:.2f} tiles={len(tiles)} zoom={z} "
              f"frame={hdu['width']}x{hdu['height']} peak_rss_mib={peak}")
    finally:
        server.terminate()
        server.wait(10)


def baseline_screen(fits_path, width, height, max_zoom):
    """numpy + astropy + Pillow: the same screen from the file: block means, default-like limits, asinh, PNGs."""
    import io
    import numpy as np
    from astropy.io import fits
    from PIL import Image
    start = time.monotonic()
    z, tiles = screen_tiles(width, height, max_zoom)
    shrink = 1 << (max_zoom - z)
    data = fits.open(fits_path, memmap=True)[0].data
    rows = []
    for y0 in range(0, height, shrink * 64):  # 64 reduced rows at a time keeps memory small
        strip = np.asarray(data[y0:y0 + shrink * 64], dtype=np.float32)
        h = strip.shape[0] // shrink * shrink
        w = strip.shape[1] // shrink * shrink
        blocks = strip[:h, :w].reshape(h // shrink, shrink, w // shrink, shrink)
        with np.errstate(invalid="ignore"):
            rows.append(np.nanmean(blocks, axis=(1, 3)))
    small = np.vstack(rows)[::-1]  # top row = highest FITS y
    # Limits as our default (median - 2 sigma, 99.9th percentile), here from the reduced image only (cheaper).
    median = np.nanmedian(small)
    sigma = 1.4826 * np.nanmedian(np.abs(small - median))
    lo, hi, soft = median - 2 * sigma, np.nanpercentile(small, 99.9), 3 * sigma
    t = np.arcsinh((np.clip(small, lo, hi) - lo) / soft) / np.arcsinh((hi - lo) / soft)
    dn = np.rint(255 * np.nan_to_num(t)).astype(np.uint8)
    count = 0
    for x, y in tiles:
        block = dn[256 * y:256 * (y + 1), 256 * x:256 * (x + 1)]
        out = io.BytesIO()
        Image.fromarray(np.ascontiguousarray(block), mode="L").save(out, format="PNG", compress_level=1)
        count += 1
    print(f"FIGURE seconds={time.monotonic() - start:.2f} tiles={count} zoom={z}")


if __name__ == "__main__":
    if len(sys.argv) == 6 and sys.argv[1] == "--baseline":
        baseline_screen(sys.argv[2], int(sys.argv[3]), int(sys.argv[4]), int(sys.argv[5]))
    elif len(sys.argv) == 8:
        main()
    else:
        sys.exit(__doc__)
