"""numpy and Pillow on the benchmark sky tile, for comparison with the BenchmarkDotNet figures.

Run with Debian's interpreter after any benchmark that sets up the tile (it exports the tile and its resolved
default display to the folder given, by default $TMPDIR/mosaic-bench-sky-tile):

    /usr/bin/python3 tests/Mosaic.Benchmarks/baseline/tile_baseline.py [folder]
"""
import io
import json
import os
import sys
import tempfile
import timeit

import numpy as np
import PIL
from PIL import Image

folder = sys.argv[1] if len(sys.argv) > 1 else os.path.join(tempfile.gettempdir(), "mosaic-bench-sky-tile")
tile = np.fromfile(os.path.join(folder, "tile.f32"), dtype="<f4").reshape(256, 256)
display = json.load(open(os.path.join(folder, "display.json")))
lo, hi, soft = display["lo"], display["hi"], display["soft"]
norm = np.arcsinh((hi - lo) / soft)


def asinh_to_8_bits():
    # The same display as ours: u clipped to the limits, asinh with pivot lo, DN = round(255 t).
    t = np.arcsinh((np.clip(tile, lo, hi) - lo) / soft) / norm
    return np.rint(255 * t).astype(np.uint8)


levels = asinh_to_8_bits()


def pillow_png():
    out = io.BytesIO()
    Image.fromarray(levels, mode="L").save(out, format="PNG", compress_level=1)
    return out.getbuffer().nbytes


def best_ms(fn, number):
    return min(timeit.repeat(fn, number=number, repeat=7)) / number * 1e3


print(f"numpy {np.__version__}, Pillow {PIL.__version__}; lo {lo:.3f} hi {hi:.3f} soft {soft:.3f}")
print(f"numpy asinh to 8 bits:        {best_ms(asinh_to_8_bits, 200):.3f} ms per tile")
print(f"Pillow PNG, compress_level 1: {best_ms(pillow_png, 100):.3f} ms per tile, {pillow_png()} bytes")
print(f"numpy + Pillow, whole tile:   {best_ms(lambda: (asinh_to_8_bits(), pillow_png()), 100):.3f} ms per tile")
