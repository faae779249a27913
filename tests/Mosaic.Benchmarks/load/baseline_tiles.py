"""The baseline for cold tiles: the same native-level chip tiles made with numpy + astropy + Pillow (Debian's
python3-numpy, python3-astropy, python3-pil), in several processes at once, each tile with its own limits as the
wrk script asks the server.

  baseline_tiles.py BASE_URL DATA_FOLDER TSV SECONDS PROCESSES

TSV is the file cold.sh gives wrk (lines "PATH<TAB>LO<TAB>HI", native-level tiles of the chips). The server at
BASE_URL is asked, before any timing, for the field's files and each band's softening, and for a few of the tiles
themselves, which are compared with ours pixel by pixel so the two sides are known to make the same pictures.
Each process opens the FITS files once (astropy, memory-mapped) and then, per tile: slices the 256 x 256 block
(the top row is the highest FITS y), converts to float32, applies the asinh stretch with pivot lo
(t = asinh((clip(v, lo, hi) - lo) / soft) / asinh((hi - lo) / soft), DN = round(255 t)), masks NaN as
transparent (gray + alpha only where a tile has NaN, as the server does) and writes a PNG with Pillow at
compress_level=1, its fastest deflate level. Prints tiles per second over all processes.
"""
import io
import json
import multiprocessing
import os
import sys
import time
import urllib.parse
import urllib.request

import numpy as np
from astropy.io import fits
from PIL import Image

TILE = 256


def get_json(url):
    with urllib.request.urlopen(url) as response:
        return json.load(response)


def parse_tiles(base, data_folder, tsv):
    """(file, hdu, z, x, y, lo, hi, soft) per line, with the file and softening the server reports."""
    tiles, files, softs = [], {}, {}
    for line in open(tsv):
        if not line.strip():
            continue
        path, lo, hi = line.rstrip("\n").split("\t")
        route, query = path.split("?", 1)
        _, _, field, z, x, y = route.removesuffix(".png").split("/")
        q = dict(urllib.parse.parse_qsl(query))
        band, hdu = q["band"], int(q["hdu"])
        if field not in files:
            listing = get_json(f"{base}/api/fields/{field}")
            for b in listing["bands"]:
                for h in b["hdus"]:
                    files[field, b["name"], h["index"]] = (os.path.join(data_folder, field, h["file"]), h["height"], h["maxZoom"])
        fits_path, height, max_zoom = files[field, band, hdu]
        if int(z) != max_zoom:
            sys.exit(f"baseline_tiles.py: {path} is not a native-level tile (zoom {max_zoom})")
        if (band, hdu) not in softs:
            display = get_json(f"{base}/api/fields/{field}/display?{urllib.parse.urlencode({'band': band, 'hdu': hdu})}")
            softs[band, hdu] = display["stretch"]["soft"]
        tiles.append((path, fits_path, hdu, height, int(x), int(y), float(lo), float(hi), softs[band, hdu]))
    return tiles


class Pipeline:
    def __init__(self):
        self.open = {}

    def data(self, fits_path, hdu):
        key = (fits_path, hdu)
        if key not in self.open:
            self.open[key] = fits.open(fits_path, memmap=True)[hdu].data
        return self.open[key]

    def levels(self, tile, lo, hi):
        _, fits_path, hdu, height, x, y, _, _, soft = tile
        data = self.data(fits_path, hdu)
        top = height - TILE * y
        block = data[max(0, top - TILE):top, TILE * x:TILE * (x + 1)][::-1].astype(np.float32)
        finite = np.isfinite(block)
        t = np.arcsinh((np.clip(block, lo, hi) - lo) / soft) / np.arcsinh((hi - lo) / soft)
        dn = np.rint(255 * np.nan_to_num(t, nan=0.0)).astype(np.uint8)
        return dn, finite

    def png(self, tile, lo, hi):
        dn, finite = self.levels(tile, lo, hi)
        if finite.all():
            image = Image.fromarray(dn, mode="L")
        else:
            image = Image.fromarray(np.dstack([dn, finite.astype(np.uint8) * 255]), mode="LA")
        out = io.BytesIO()
        image.save(out, format="PNG", compress_level=1)
        return out.getbuffer().nbytes


def check_same(base, tiles, count):
    """Largest |ours - baseline| in DN over the first tiles, where the pixel is shown by both."""
    pipeline, worst = Pipeline(), 0
    for tile in tiles[:count]:
        path, lo, hi = tile[0], tile[6], tile[7]
        with urllib.request.urlopen(f"{base}{path}&limits=value&lo={lo!r}&hi={hi!r}") as response:
            ours = Image.open(io.BytesIO(response.read()))
            ours.load()
        dn, finite = pipeline.levels(tile, lo, hi)
        gray = np.asarray(ours.convert("LA"))
        if gray.shape[:2] != dn.shape:
            sys.exit(f"baseline_tiles.py: {path}: our tile is {gray.shape[:2]}, the baseline's {dn.shape}")
        if not np.array_equal(gray[..., 1] > 0, finite):
            sys.exit(f"baseline_tiles.py: {path}: the transparent pixels differ")
        if finite.any():
            worst = max(worst, int(np.abs(gray[..., 0].astype(int) - dn.astype(int))[finite].max()))
    return worst


def worker(args):
    tiles, start, seconds, offset = args
    pipeline = Pipeline()
    for tile in tiles[:8]:
        pipeline.png(tile, tile[6], tile[7])  # open the files, touch the code paths
    while time.time() < start:
        time.sleep(0.001)
    done, i, end = 0, offset, start + seconds
    while time.time() < end:
        tile = tiles[i % len(tiles)]
        lo, hi = tile[6], tile[7]
        pipeline.png(tile, lo + (hi - lo) * 1e-8 * (done * 64 + offset), hi)  # new limits every tile, as cold.lua
        done += 1
        i += 1
    return done, time.time() - start


def main():
    if len(sys.argv) != 6:
        sys.exit("usage: baseline_tiles.py BASE_URL DATA_FOLDER TSV SECONDS PROCESSES")
    base, data_folder, tsv = sys.argv[1].rstrip("/"), sys.argv[2], sys.argv[3]
    seconds, processes = float(sys.argv[4]), int(sys.argv[5])
    tiles = parse_tiles(base, data_folder, tsv)
    worst = check_same(base, tiles, 12)
    if worst > 1:
        sys.exit(f"baseline_tiles.py: the baseline's tiles differ from ours by up to {worst} DN: not the same tiles")
    start = time.time() + 2
    with multiprocessing.get_context("fork").Pool(processes) as pool:
        results = pool.map(worker, [(tiles, start, seconds, p * 97) for p in range(processes)])
    total = sum(r[0] for r in results)
    elapsed = max(r[1] for r in results)
    import astropy, PIL
    print(f"BASELINE numpy {np.__version__}, astropy {astropy.__version__}, Pillow {PIL.__version__}; "
          f"{processes} processes, {len(tiles)} tiles, same pictures as ours within {worst} DN")
    print(f"FIGURE tiles={total} seconds={elapsed:.2f} rps={total / elapsed:.0f} ms_per_tile_per_process={1000 * elapsed * processes / total:.3f}")


if __name__ == "__main__":
    main()
