"""Tile paths of a field for the load scripts, one per line, from the server's own field listing.

  tile_urls.py [--limits] [--native] BASE_URL FIELD COUNT [QUERY]

Default: every band's whole-field canvas (or its first chip where a band has no canvas) from zoom 0 down, in row
order, until COUNT paths are listed. --native: the chips' native-level tiles instead (one image pixel per tile
pixel, read from the FITS files), taken in turn from every band and chip. Each path carries the band's version (v=)
as the browser's URLs do, plus QUERY (extra parameters) when given. --limits: lines "PATH<TAB>LO<TAB>HI" with the
limits the server resolves for that band and HDU's default display. Debian's /usr/bin/python3, standard library.
"""
import itertools
import json
import sys
import urllib.parse
import urllib.request


def tiles_across(size, zoom, max_zoom):
    # Zoom z shows the HDU at 2^(z - maxZoom) of its size in 256-pixel tiles (DEVELOPERS.md, Conventions).
    scaled = -(-size // (1 << (max_zoom - zoom)))
    return max(1, -(-scaled // 256))


def get_json(url):
    with urllib.request.urlopen(url) as response:
        return json.load(response)


def overview_tiles(listing):
    """(band, version, hdu, z, x, y) from zoom 0 down over each band's canvas."""
    sources = []
    for band in listing["bands"]:
        canvas = band.get("canvas")
        hdu = band["hdus"][0]
        geometry = canvas if canvas else hdu
        sources.append((band["name"], band["version"], "canvas" if canvas else str(hdu["index"]),
                        geometry["width"], geometry["height"], geometry["maxZoom"]))
    for zoom in range(max(s[5] for s in sources) + 1):
        for name, version, hdu, width, height, max_zoom in sources:
            if zoom <= max_zoom:
                for y in range(tiles_across(height, zoom, max_zoom)):
                    for x in range(tiles_across(width, zoom, max_zoom)):
                        yield name, version, hdu, zoom, x, y


def native_tiles(listing):
    """(band, version, hdu, z, x, y) at each chip's deepest zoom, one from every band and chip in turn."""
    def chip(band, hdu):
        z = hdu["maxZoom"]
        for y in range(tiles_across(hdu["height"], z, z)):
            for x in range(tiles_across(hdu["width"], z, z)):
                yield band["name"], band["version"], str(hdu["index"]), z, x, y

    walks = [chip(band, hdu) for band in listing["bands"] for hdu in band["hdus"]]
    for batch in itertools.zip_longest(*walks):
        yield from (t for t in batch if t is not None)


def main():
    args = sys.argv[1:]
    flags = {a for a in args if a.startswith("--")}
    args = [a for a in args if not a.startswith("--")]
    if len(args) not in (3, 4) or flags - {"--limits", "--native"}:
        sys.exit("usage: tile_urls.py [--limits] [--native] BASE_URL FIELD COUNT [QUERY]")
    base, field, count = args[0].rstrip("/"), args[1], int(args[2])
    extra = "&" + args[3] if len(args) == 4 and args[3] else ""
    quoted = urllib.parse.quote(field)
    listing = get_json(f"{base}/api/fields/{quoted}")
    tiles = native_tiles(listing) if "--native" in flags else overview_tiles(listing)
    limits = {}
    lines = []
    for band, version, hdu, z, x, y in itertools.islice(tiles, count):
        query = urllib.parse.urlencode({"band": band, "hdu": hdu, "v": version})
        line = f"/tiles/{quoted}/{z}/{x}/{y}.png?{query}{extra}"
        if "--limits" in flags:
            if (band, hdu) not in limits:
                display = get_json(f"{base}/api/fields/{quoted}/display?{urllib.parse.urlencode({'band': band, 'hdu': hdu})}")
                limits[band, hdu] = display["lo"], display["hi"]
            lo, hi = limits[band, hdu]
            line = f"{line}\t{lo!r}\t{hi!r}"
        lines.append(line)
    if len(lines) < count:
        sys.exit(f"tile_urls.py: the field has only {len(lines)} such tiles, fewer than {count}")
    print("\n".join(lines))


main()
