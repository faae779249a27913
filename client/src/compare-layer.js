// A second picture of the same image over the first, to compare the two: either cut at a divider that can be
// dragged (the first layer left of it, the second right) or shown and hidden in turn at a set interval. The second
// layer has its own masked-colour blocks, so its masked pixels never show the first layer through.
import { TileLayer, DomUtil, DomEvent, Rectangle, SVG } from 'leaflet';
import { MaskLayer } from './mask-layer.js';

// Over the first layer's tiles (tile pane: 200) and under Leaflet's controls.
const MASK_PANE = 'compareMaskPane';
const OUTLINE_PANE = 'compareOutlinePane';
const TILE_PANE = 'compareTilePane';
const MASK_PANE_Z = 210;
// As under the first layer: the image's outline between the masked colour and the tiles hides the sliver of
// masked colour a fractional zoom can leave at the image's edge.
const OUTLINE_PANE_Z = 215;
const TILE_PANE_Z = 220;
// Arrow keys move the divider by a hundredth of the view, Page Up/Down by a tenth.
const KEY_STEP = 0.01;
const PAGE_STEP = 0.1;

const clamp = (value) => Math.min(1, Math.max(0, value));

/**
 * Fires `divider` with the divider's share of the view's width (0 at the left edge) in `detail` when a drag or key
 * press has moved it, and `blink` with which layer is on show ("first" or "second").
 */
export class CompareLayer extends EventTarget {
  #map;
  #container;
  #grid;
  #panes;
  #tiles = null;
  #mask = null;
  #tileUrl = null;
  #mode = null;
  #divider = 0.5;
  #interval = 800;
  #timer = null;
  #showingSecond = true;
  #dividerElement;
  #labels;
  #reclip = () => this.#clip();

  /** `grid`: the tile grid options of the first layer ({tileSize, bounds, minZoom, ..., geometry}). */
  constructor(map, container, grid) {
    super();
    this.#map = map;
    this.#container = container;
    this.#grid = grid;
    const maskPane = map.getPane(MASK_PANE) ?? map.createPane(MASK_PANE);
    const outlinePane = map.getPane(OUTLINE_PANE) ?? map.createPane(OUTLINE_PANE);
    const tilePane = map.getPane(TILE_PANE) ?? map.createPane(TILE_PANE);
    maskPane.style.zIndex = String(MASK_PANE_Z);
    outlinePane.style.zIndex = String(OUTLINE_PANE_Z);
    tilePane.style.zIndex = String(TILE_PANE_Z);
    this.#panes = [maskPane, outlinePane, tilePane];
    new Rectangle(grid.bounds, {
      pane: OUTLINE_PANE,
      renderer: new SVG({ pane: OUTLINE_PANE, padding: 0.5 }),
      className: 'image-outline',
      weight: 1,
      fill: false,
      interactive: false,
    }).addTo(map);
    this.#dividerElement = this.#createDivider();
    this.#labels = {
      first: DomUtil.create('span', 'compare-label compare-label-first', container),
      second: DomUtil.create('span', 'compare-label compare-label-second', container),
    };
    this.#labels.first.dataset.role = 'compare-first';
    this.#labels.second.dataset.role = 'compare-second';
    map.on('move zoom zoomend viewreset resize', this.#reclip);
    this.#apply();
  }

  /**
   * Shows the comparison: `tileUrl` the second layer's tiles, `mode` "swipe" or "blink", `divider` (0..1),
   * `interval` (ms), `labels` ({first, second}: what each layer is). Null stops comparing.
   */
  set(spec) {
    if (spec === null) {
      this.#mode = null;
      this.#apply();
      return;
    }
    this.#mode = spec.mode;
    if (Number.isFinite(spec.divider)) this.#divider = clamp(spec.divider);
    const interval = Number.isFinite(spec.interval) ? spec.interval : this.#interval;
    const restart = interval !== this.#interval;
    this.#interval = interval;
    this.#labels.first.textContent = spec.labels?.first ?? '';
    this.#labels.second.textContent = spec.labels?.second ?? '';
    this.#setTiles(spec.tileUrl);
    if (restart) this.#stopBlink();
    this.#apply();
  }

  remove() {
    this.#stopBlink();
    this.#map.off('move zoom zoomend viewreset resize', this.#reclip);
    this.#tiles?.remove();
    this.#mask?.remove();
    this.#dividerElement.remove();
    this.#labels.first.remove();
    this.#labels.second.remove();
  }

  #setTiles(tileUrl) {
    if (this.#tiles !== null && this.#tileUrl === tileUrl) return;
    this.#tileUrl = tileUrl;
    if (this.#tiles !== null) {
      this.#tiles.setUrl(tileUrl);
      return;
    }
    const { geometry, ...grid } = this.#grid;
    this.#tiles = new TileLayer(tileUrl, { ...grid, pane: TILE_PANE, className: 'compare-tiles' });
    this.#mask = new MaskLayer(this.#tiles, { ...grid, geometry, pane: MASK_PANE, className: 'mask-tiles' });
    this.#mask.addTo(this.#map);
    this.#tiles.addTo(this.#map);
  }

  #apply() {
    const mode = this.#mode;
    this.#container.dataset.compare = mode ?? '';
    if (mode === null) {
      this.#stopBlink();
      this.#tiles?.remove();
      this.#mask?.remove();
      this.#tiles = null;
      this.#mask = null;
      this.#tileUrl = null;
      delete this.#container.dataset.showing;
    }
    this.#dividerElement.hidden = mode !== 'swipe';
    this.#labels.first.hidden = mode === null;
    this.#labels.second.hidden = mode === null;
    if (mode === 'blink') this.#startBlink();
    else this.#stopBlink();
    if (mode === 'swipe') this.#setShowing(true);
    this.#clip();
  }

  #startBlink() {
    if (this.#timer !== null) return;
    this.#setShowing(true);
    this.#timer = setInterval(() => this.#setShowing(!this.#showingSecond), this.#interval);
  }

  #stopBlink() {
    clearInterval(this.#timer);
    this.#timer = null;
  }

  #setShowing(second) {
    this.#showingSecond = second;
    const hide = this.#mode === 'blink' && !second;
    for (const pane of this.#panes) pane.style.visibility = hide ? 'hidden' : '';
    if (this.#mode === null) return;
    const showing = second ? 'second' : 'first';
    this.#container.dataset.showing = showing;
    // In a blink only the layer on show is named; the swipe names both, one each side of the divider.
    if (this.#mode === 'blink') {
      this.#labels.first.hidden = second;
      this.#labels.second.hidden = !second;
      this.dispatchEvent(new CustomEvent('blink', { detail: showing }));
    }
  }

  // The second layer's panes are cut to the part of the view right of the divider (in pane coordinates, which
  // move with the map).
  #clip() {
    const swipe = this.#mode === 'swipe';
    const size = this.#map.getSize();
    const x = Math.round(this.#divider * size.x);
    this.#dividerElement.style.left = `${x}px`;
    this.#dividerElement.setAttribute('aria-valuenow', String(Math.round(this.#divider * 100)));
    this.#labels.first.style.right = swipe ? `${size.x - x + 8}px` : '';
    this.#labels.second.style.left = swipe ? `${x + 8}px` : '';
    for (const pane of this.#panes) {
      if (!swipe) {
        pane.style.clip = '';
        continue;
      }
      const origin = this.#map.containerPointToLayerPoint([0, 0]);
      pane.style.clip = `rect(${origin.y}px, ${origin.x + size.x}px, ${origin.y + size.y}px, ${origin.x + x}px)`;
    }
  }

  #moveDivider(share, settle) {
    this.#divider = clamp(share);
    this.#clip();
    if (settle) this.dispatchEvent(new CustomEvent('divider', { detail: Math.round(this.#divider * 1000) / 1000 }));
  }

  #createDivider() {
    const element = DomUtil.create('div', 'compare-divider', this.#container);
    element.tabIndex = 0;
    element.setAttribute('role', 'slider');
    element.setAttribute('aria-label', 'Divider between the two layers: left of it the first, right of it the second');
    element.setAttribute('aria-valuemin', '0');
    element.setAttribute('aria-valuemax', '100');
    element.dataset.role = 'compare-divider';
    DomUtil.create('span', 'compare-divider-grip', element);
    // The map must not pan or zoom while the divider is worked.
    DomEvent.disableClickPropagation(element);
    DomEvent.disableScrollPropagation(element);
    const shareAt = (event) => {
      const box = this.#container.getBoundingClientRect();
      return (event.clientX - box.left) / box.width;
    };
    element.addEventListener('pointerdown', (event) => {
      event.preventDefault();
      event.stopPropagation();
      element.setPointerCapture(event.pointerId);
      element.classList.add('dragging');
    });
    element.addEventListener('pointermove', (event) => {
      if (element.hasPointerCapture(event.pointerId)) this.#moveDivider(shareAt(event), false);
    });
    const release = (event) => {
      if (!element.hasPointerCapture(event.pointerId)) return;
      element.releasePointerCapture(event.pointerId);
      element.classList.remove('dragging');
      this.#moveDivider(shareAt(event), true);
    };
    element.addEventListener('pointerup', release);
    element.addEventListener('pointercancel', release);
    element.addEventListener('keydown', (event) => {
      const steps = { ArrowLeft: -KEY_STEP, ArrowRight: KEY_STEP, PageDown: -PAGE_STEP, PageUp: PAGE_STEP, Home: -1, End: 1 };
      if (!(event.key in steps)) return;
      event.preventDefault();
      event.stopPropagation();
      this.#moveDivider(this.#divider + steps[event.key], true);
    });
    return element;
  }
}
