// The masked colour under the image tiles: one block per tile, covering exactly that tile's part of the image, shown
// only once the image tile above it has loaded. Transparent (masked) pixels of a tile then show the masked colour,
// while a tile still loading, and everything outside the image, shows the map's neutral background instead. (Behind
// each tile's own <img> as a CSS background, the mask would bleed into the next tile's edge at fractional zooms.)
import { GridLayer, DomUtil } from 'leaflet';
import { imagePartOfTile, TILE_SIZE } from './tile-geometry.js';

const key = ({ x, y, z }) => `${x}:${y}:${z}`;

export const MaskLayer = GridLayer.extend({
  // options.geometry: {width, height, maxZoom} of the image; the rest as the image layer's, so the grids match.
  initialize(imageLayer, options) {
    GridLayer.prototype.initialize.call(this, options);
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
    block.hidden = !this._loaded.has(key(coords));
    this._blocks.set(key(coords), block);
    return tile;
  },

  _show(coords, loaded) {
    const id = key(coords);
    if (loaded) this._loaded.add(id);
    else this._loaded.delete(id);
    const block = this._blocks.get(id);
    if (block) block.hidden = !loaded;
  },
});
