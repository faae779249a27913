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

// Each outline ([[x, y], ...] in FITS pixels) as an SVG path in the level pixels of zoom z, counted from the image's
// top-left corner (0.5, height + 0.5) = level pixel (0, 0), with its bounding box there. Made once per zoom: a tile
// takes the outlines that reach it, moved to its own top-left corner by a whole number of pixels.
function levelPaths(shapes, { height, maxZoom }, z) {
  const factor = 2 ** (maxZoom - z);
  return shapes.filter((outline) => outline.length >= 3).map((outline) => {
    const us = outline.map(([fx]) => (fx - 0.5) / factor);
    const vs = outline.map(([, fy]) => (height + 0.5 - fy) / factor);
    return {
      u0: Math.min(...us), u1: Math.max(...us), v0: Math.min(...vs), v1: Math.max(...vs),
      d: `M${us.map((u, i) => `${u.toFixed(2)} ${vs[i].toFixed(2)}`).join('L')}Z`,
    };
  });
}

// The outlines reaching tile (x, y): a pixel of margin, as one that only grazes its edge might still tint it.
function tilePath(paths, { x, y }) {
  const [left, top] = [x * TILE_SIZE, y * TILE_SIZE];
  return paths
    .filter((p) => p.u1 >= left - 1 && p.u0 <= left + TILE_SIZE + 1 && p.v1 >= top - 1 && p.v0 <= top + TILE_SIZE + 1)
    .map((p) => p.d)
    .join('');
}

export const MaskLayer = GridLayer.extend({
  // options.geometry: {width, height, maxZoom} of the image; the rest as the image layer's, so the grids match.
  initialize(imageLayer, options) {
    GridLayer.prototype.initialize.call(this, options);
    this._insetShapes = insetShapes(options.shapes ?? null);
    this._paths = new Map();
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
    this._paths = new Map();
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
    if (!this._paths.has(coords.z)) this._paths.set(coords.z, levelPaths(shapes, this.options.geometry, coords.z));
    const path = document.createElementNS(SVG_NS, 'path');
    path.setAttribute('d', tilePath(this._paths.get(coords.z), coords));
    path.setAttribute('transform', `translate(${-coords.x * TILE_SIZE} ${-coords.y * TILE_SIZE})`);
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
