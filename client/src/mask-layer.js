// The masked colour under the image tiles: one block per tile, covering exactly that tile's part of the image, shown
// only once the image tile above it has loaded. Transparent (masked) pixels of a tile then show the masked colour,
// while a tile still loading, and everything outside the image, shows the map's neutral background instead. (Behind
// each tile's own <img> as a CSS background, the mask would bleed into the next tile's edge at fractional zooms.)
// On the whole field the masked colour covers only the chips (their outlines), so the gaps between them show the
// neutral background, as no-data and not as masked pixels.
import { GridLayer, DomUtil } from 'leaflet';
import { imagePartOfTile, TILE_SIZE } from './tile-geometry.js';

const key = ({ x, y, z }) => `${x}:${y}:${z}`;
const SVG_NS = 'http://www.w3.org/2000/svg';

// Image pixels the masked colour keeps inside each chip's outline: a pixel of the whole field whose centre lies just
// outside a chip is no-data, yet the outline crosses it; unshrunk, it would show a sliver of the masked colour.
const SHAPE_INSET = 1;

// The outline pulled in by `inset` pixels towards its middle, axis by axis (chips are close to upright rectangles).
function insetOutline(outline, inset) {
  const xs = outline.map(([x]) => x);
  const ys = outline.map(([, y]) => y);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const [cx, cy] = [(x0 + x1) / 2, (y0 + y1) / 2];
  const kx = Math.max(0, 1 - inset / Math.max((x1 - x0) / 2, inset));
  const ky = Math.max(0, 1 - inset / Math.max((y1 - y0) / 2, inset));
  return outline.map(([x, y]) => [cx + (x - cx) * kx, cy + (y - cy) * ky]);
}

function insetShapes(shapes) {
  return shapes === null ? null : shapes.filter((outline) => outline.length >= 3).map((outline) => insetOutline(outline, SHAPE_INSET));
}

// The outlines ([[x, y], ...] in FITS pixels) as one SVG path in the level pixels of tile (x, y, z), counted from
// the tile's top-left corner: the image's top-left corner (0.5, height + 0.5) is level pixel (0, 0).
function shapesPath(shapes, { width, height, maxZoom }, { x, y, z }) {
  const factor = 2 ** (maxZoom - z);
  const u = (fx) => (fx - 0.5) / factor - x * TILE_SIZE;
  const v = (fy) => (height + 0.5 - fy) / factor - y * TILE_SIZE;
  return shapes
    .filter((outline) => outline.length >= 3)
    .map((outline) => `M${outline.map(([fx, fy]) => `${u(fx).toFixed(2)} ${v(fy).toFixed(2)}`).join('L')}Z`)
    .join('');
}

export const MaskLayer = GridLayer.extend({
  // options.geometry: {width, height, maxZoom} of the image; the rest as the image layer's, so the grids match.
  initialize(imageLayer, options) {
    GridLayer.prototype.initialize.call(this, options);
    this._insetShapes = insetShapes(options.shapes ?? null);
    this._imageLayer = imageLayer;
    this._loaded = new Set();
    this._blocks = new Map();
    this._onImageTileLoad = ({ coords }) => this._show(coords, true);
    this._onImageTileUnload = ({ coords }) => this._show(coords, false);
    this.on('tileunload', ({ coords }) => this._blocks.delete(key(coords)));
  },

  onAdd(map) {
    GridLayer.prototype.onAdd.call(this, map);
    this._imageLayer.on('tileload', this._onImageTileLoad).on('tileunload', this._onImageTileUnload);
  },

  onRemove(map) {
    this._imageLayer.off('tileload', this._onImageTileLoad).off('tileunload', this._onImageTileUnload);
    GridLayer.prototype.onRemove.call(this, map);
  },

  createTile(coords) {
    const tile = DomUtil.create('div', 'mask-tile');
    tile.style.width = tile.style.height = `${TILE_SIZE}px`;
    const block = DomUtil.create('div', 'mask-block', tile);
    const part = imagePartOfTile(this.options.geometry, coords);
    block.style.width = `${part.width}px`;
    block.style.height = `${part.height}px`;
    this._shape(block, coords);
    block.hidden = !this._loaded.has(key(coords));
    this._blocks.set(key(coords), block);
    return tile;
  },

  /** The outlines the masked colour is limited to ([[[x, y], ...], ...] in FITS pixels), or null for the whole image. */
  setShapes(shapes) {
    this.options.shapes = shapes;
    this._insetShapes = insetShapes(shapes);
    for (const { coords } of Object.values(this._tiles ?? {})) {
      const block = this._blocks.get(key(coords));
      if (block) this._shape(block, coords);
    }
  },

  _shape(block, coords) {
    const shapes = this._insetShapes;
    block.classList.toggle('mask-block-shaped', shapes !== null);
    block.replaceChildren();
    if (shapes === null) return;
    const svg = document.createElementNS(SVG_NS, 'svg');
    svg.setAttribute('width', String(TILE_SIZE));
    svg.setAttribute('height', String(TILE_SIZE));
    const path = document.createElementNS(SVG_NS, 'path');
    path.setAttribute('d', shapesPath(shapes, this.options.geometry, coords));
    svg.append(path);
    block.append(svg);
  },

  _show(coords, loaded) {
    const id = key(coords);
    if (loaded) this._loaded.add(id);
    else this._loaded.delete(id);
    const block = this._blocks.get(id);
    if (block) block.hidden = !loaded;
  },
});
