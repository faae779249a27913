// The pannable, zoomable image: a Leaflet map in FITS pixel coordinates showing one HDU's tiles over a layer in the
// masked colour (see mask-layer.js), so masked (transparent) pixels show that colour and nothing else does.
import { Map as LeafletMap, SVG, Rectangle, TileLayer, Control, Point, Util } from 'leaflet';
import { createPixelCrs, imageBounds } from './pixel-crs.js';
import { MaskLayer } from './mask-layer.js';
import { FitControl } from './fit-control.js';
import { CompareLayer } from './compare-layer.js';
import { BOUNDS_PAD, centringZoom } from './view-limits.js';

// Beyond native resolution each image pixel becomes an 8 x 8 block at most.
const ZOOM_PAST_NATIVE = 3;
// One zoom level below the whole-image tile, to see a tall chip whole in a short window.
const MIN_ZOOM = -1;
// Under the tile pane (200): the masked colour, and over it the image's outline, seen while tiles load.
const MASK_PANE = 'maskPane';
const MASK_PANE_Z = 150;
const OUTLINE_PANE = 'outlinePane';
const OUTLINE_PANE_Z = 160;

function sameGeometry(a, b) {
  return a !== null && b !== null && a.width === b.width && a.height === b.height && a.maxZoom === b.maxZoom;
}

/**
 * Fires `viewchange` ({x, y, z}: the centre in FITS pixels and the zoom) when a pan or zoom ends, and `pointer`
 * ({x, y} in FITS pixels, or null when the pointer leaves) whenever the image point under the pointer changes. When
 * the view is worked from the keyboard, the point probed is the one under a crosshair at its middle. Fires `moving`
 * ({x, y, z}) all through a pan or zoom, for views kept in step with this one, and `divider` (a share of the width)
 * when the comparison's divider was moved.
 */
export class ImageView extends EventTarget {
  #container;
  #map = null;
  #geometry = null;
  #bounds = null;
  #tiles = null;
  #mask = null;
  #tileUrl = null;
  #pointer = null;
  // Layers drawn over the image (grid, marks): carried over to each new map.
  #overlays = new Set();
  // Keys move the map under a crosshair at the middle, and the readout follows that instead of the mouse.
  #keyboardProbe = false;
  #compare = null;
  #compareSpec = null;
  #marker = null;
  #markerElement = null;
  // Set while the view is moved to follow another, so that it does not report the move back.
  #following = false;
  // Set while showEarly() puts the first picture up; the view it lands on is reported by the next show().
  #early = false;
  #viewOwed = false;

  constructor(container) {
    super();
    this.#container = container;
    // On the container, which outlives each map made in it.
    container.addEventListener('blur', () => {
      if (this.#keyboardProbe) this.#setPointer(null);
      this.#setKeyboardProbe(false);
    });
    // pointermove, not Leaflet's mousemove: Chromium gives a mouse event whole CSS pixels, a pointer event the
    // fractional position, and past native zoom a truncated position can fall in the neighbouring image pixel.
    container.addEventListener('pointermove', (event) => {
      if (this.#map === null) return;
      this.#setKeyboardProbe(false);
      this.#setPointer(this.#map.mouseEventToContainerPoint(event));
    });
    // The display panel opening or closing resizes the view without resizing the window. Only a real change of size
    // is passed on: Leaflet's invalidateSize forgets the exact centre (it is then read back to whole screen pixels),
    // and the observer's first report can come after the first picture is up.
    new ResizeObserver(() => {
      const size = this.#map?.getSize();
      if (size === undefined || (size.x === container.clientWidth && size.y === container.clientHeight)) return;
      this.#map.invalidateSize({ pan: false });
    }).observe(container);
  }

  /**
   * The FITS pixels (1-based, inclusive) of the shown image that are at least partly on screen, or null when none
   * is: pixel i covers [i - 0.5, i + 0.5).
   */
  get visibleBox() {
    if (this.#map === null) return null;
    const bounds = this.#map.getBounds();
    const first = (low) => Math.floor(low - 0.5) + 1;
    const last = (high) => Math.ceil(high + 0.5) - 1;
    const x0 = Math.max(1, first(bounds.getWest()));
    const x1 = Math.min(this.#geometry.width, last(bounds.getEast()));
    const y0 = Math.max(1, first(bounds.getSouth()));
    const y1 = Math.min(this.#geometry.height, last(bounds.getNorth()));
    return x0 <= x1 && y0 <= y1 ? { x0, y0, x1, y1 } : null;
  }

  /**
   * The same image drawn another way (new display settings): each tile on screen keeps its old picture until the
   * new one has arrived, so a change never flashes the background.
   */
  restyle(tileUrl) {
    if (this.#tiles === null || this.#tileUrl === tileUrl) return;
    this.#tileUrl = tileUrl;
    this.#tiles.setUrl(tileUrl, true);
    for (const { el, coords } of Object.values(this.#tiles._tiles)) {
      const src = Util.template(tileUrl, { x: coords.x, y: coords.y, z: coords.z });
      el.dataset.wanted = src;
      if (!el.complete || !el.src) {
        el.src = src;
        continue;
      }
      const next = new Image();
      const swap = () => {
        // A later change may have asked for another picture meanwhile.
        if (el.dataset.wanted === src) el.src = src;
      };
      next.onload = swap;
      next.onerror = swap;
      next.src = src;
    }
  }

  /**
   * The map area on screen in FITS coordinates (fractional, may extend past the image), the image's size, the view's
   * size in screen pixels and `scale`, screen pixels per image pixel; null before anything is shown.
   */
  get screen() {
    if (this.#map === null) return null;
    const bounds = this.#map.getBounds();
    const size = this.#map.getSize();
    return {
      x0: bounds.getWest(),
      x1: bounds.getEast(),
      y0: bounds.getSouth(),
      y1: bounds.getNorth(),
      width: size.x,
      height: size.y,
      scale: 2 ** (this.#map.getZoom() - this.#geometry.maxZoom),
      imageWidth: this.#geometry.width,
      imageHeight: this.#geometry.height,
    };
  }

  /**
   * The lowest zoom from `zoom` up at which FITS position (x, y) of an image `width` x `height` with native zoom
   * `maxZoom` can be at the middle of this view: zoomed out, the view is kept over the image and a point near its
   * edge could not be centred.
   */
  centringZoom(x, y, zoom, { width, height, maxZoom } = this.#geometry) {
    const viewSize = { viewWidth: this.#container.clientWidth, viewHeight: this.#container.clientHeight };
    return centringZoom({ width, height, nativeZoom: maxZoom, maxZoom: maxZoom + ZOOM_PAST_NATIVE }, viewSize, x, y, zoom);
  }

  /** Puts FITS position (x, y) at the middle of the view, zooming in only as far as that needs. */
  centreOn(x, y) {
    if (this.#map === null) return;
    // reset: a pan moves by whole screen pixels, and the point would miss the middle by up to one.
    this.#map.setView([y, x], this.centringZoom(x, y, this.#map.getZoom()), { reset: true });
  }

  /** Draws a Leaflet layer over the image, on this map and every later one, until `removeOverlay`. */
  addOverlay(layer) {
    this.#overlays.add(layer);
    if (this.#map !== null) layer.addTo(this.#map);
  }

  removeOverlay(layer) {
    this.#overlays.delete(layer);
    layer.remove();
  }

  /** The centre (FITS pixels) and zoom, or null before anything is shown. */
  get view() {
    if (this.#map === null) return null;
    const centre = this.#map.getCenter();
    return { x: centre.lng, y: centre.lat, z: this.#map.getZoom() };
  }

  /**
   * Shows the tiles at `tileUrl` of an image of `width` x `height` pixels whose native zoom is `maxZoom`. With a
   * `view` ({x, y, z}) it goes there; without one it keeps the current view when the geometry is unchanged (another
   * band of the same chip) and shows the whole image otherwise. `maskShapes` (outlines in FITS pixels) limits the
   * masked colour to the chips of a whole field; null spreads it over the whole image.
   */
  show({ tileUrl, width, height, maxZoom, maskShapes = null }, view = null) {
    const geometry = { width, height, maxZoom };
    const keep = sameGeometry(this.#geometry, geometry);
    if (!keep) this.#createMap(geometry);
    if (this.#tiles === null) {
      this.#tiles = this.#createTiles(tileUrl, geometry, maskShapes).addTo(this.#map);
    } else {
      this.#mask.setShapes(maskShapes);
      if (this.#tileUrl !== tileUrl) {
        this.#tiles.setUrl(tileUrl, true);
        this.#reloadTiles();
      }
    }
    this.#tileUrl = tileUrl;
    if (view !== null) {
      this.#map.setView([view.y, view.x], view.z, { animate: false });
    } else if (!keep) {
      this.fitImage(false);
    }
    if (this.#viewOwed && !this.#early) this.#reportView();
  }

  #reportView() {
    this.#viewOwed = false;
    this.dispatchEvent(new CustomEvent('viewchange', { detail: this.view }));
  }

  /**
   * The first picture, shown before the rest of the page is ready so that its tiles are asked for at once: as
   * show(), but firing no `viewchange` or `moving`; the view it lands on is reported by the next show(), which finds
   * the same picture on screen and keeps it.
   */
  showEarly(spec, view = null) {
    this.#early = true;
    try {
      this.show(spec, view);
    } finally {
      this.#early = false;
    }
    this.#viewOwed = this.#map !== null;
  }

  /** Requests every tile again: after the pyramid of the shown HDU became ready. */
  refreshTiles() {
    this.#reloadTiles();
  }

  // Leaflet 1.9.4's GridLayer.redraw takes the map's zoom unrounded as the tile level, so at a fractional zoom it
  // would ask for tiles of level 2.25; taking the layer off the map and back goes through its view reset, which
  // rounds. The mask layer follows the image layer's tile events, so it empties and refills with it.
  #reloadTiles() {
    if (this.#tiles === null || this.#map === null) return;
    this.#tiles.remove();
    this.#tiles.addTo(this.#map);
  }

  /** Goes to `view` ({x, y, z}) at once, firing no `moving`: for a view that follows another. */
  follow(view) {
    if (this.#map === null || view === null) return;
    const here = this.view;
    if (here.x === view.x && here.y === view.y && here.z === view.z) return;
    this.#following = true;
    try {
      this.#map.setView([view.y, view.x], view.z, { animate: false });
    } finally {
      this.#following = false;
    }
  }

  /**
   * Marks FITS position `at` ({x, y}) with a small cross: the point another view is pointed at. Null removes it.
   */
  setMarker(at) {
    this.#marker = at;
    this.#placeMarker();
  }

  #placeMarker() {
    if (this.#markerElement === null) {
      this.#markerElement = document.createElement('div');
      this.#markerElement.className = 'echo-marker';
      this.#markerElement.setAttribute('aria-hidden', 'true');
      this.#container.append(this.#markerElement);
    }
    const at = this.#marker;
    this.#markerElement.hidden = at === null || this.#map === null;
    if (this.#markerElement.hidden) return;
    const point = this.#map.latLngToContainerPoint([at.y, at.x]);
    this.#markerElement.style.transform = `translate(${Math.round(point.x)}px, ${Math.round(point.y)}px)`;
  }

  /**
   * Lays a second picture over the image to compare with (see compare-layer.js): {tileUrl, mode: "swipe" |
   * "blink", divider, interval, labels}; null shows the image alone.
   */
  setCompare(spec) {
    this.#compareSpec = spec;
    this.#compare?.set(spec);
  }

  fitImage(animate = true) {
    if (this.#map === null) return;
    this.#map.fitBounds(this.#bounds, { animate, padding: [16, 16] });
  }

  #createMap(geometry) {
    if (this.#map !== null) {
      this.#compare?.remove();
      this.#compare = null;
      this.#map.remove();
      this.#tiles = null;
      this.#mask = null;
      this.#pointer = null;
      this.#setKeyboardProbe(false);
    }
    this.#geometry = geometry;
    this.#bounds = imageBounds(geometry.width, geometry.height);
    const map = new LeafletMap(this.#container, {
      crs: createPixelCrs(geometry.height, geometry.maxZoom),
      minZoom: MIN_ZOOM,
      maxZoom: geometry.maxZoom + ZOOM_PAST_NATIVE,
      zoomSnap: 0.25,
      zoomDelta: 0.5,
      wheelPxPerZoomLevel: 90,
      keyboardPanDelta: 120,
      // Loose bounds: the image can be dragged half off screen, never lost.
      maxBounds: this.#bounds.pad(BOUNDS_PAD),
      maxBoundsViscosity: 0.8,
      attributionControl: false,
      zoomControl: false,
      // Tiles show at once when loaded: a tile fading in would let the masked colour under it shine through.
      fadeAnimation: false,
    });
    this.#map = map;
    new Control.Zoom({ position: 'topright', zoomInTitle: 'Zoom in', zoomOutTitle: 'Zoom out' }).addTo(map);
    new FitControl({ onFit: () => this.fitImage() }).addTo(map);

    map.createPane(MASK_PANE).style.zIndex = String(MASK_PANE_Z);
    map.createPane(OUTLINE_PANE).style.zIndex = String(OUTLINE_PANE_Z);
    new Rectangle(this.#bounds, {
      pane: OUTLINE_PANE,
      renderer: new SVG({ pane: OUTLINE_PANE, padding: 0.5 }),
      className: 'image-outline',
      weight: 1,
      fill: false,
      interactive: false,
    }).addTo(map);

    for (const layer of this.#overlays) layer.addTo(map);

    map.on('zoomend', () => this.#markPastNative());
    map.on('moveend', () => {
      if (this.#early) return;
      this.#reportView();
    });
    map.on('mouseout', () => {
      if (!this.#keyboardProbe) this.#setPointer(null);
    });
    map.on('keydown', () => {
      this.#setKeyboardProbe(true);
      this.#setPointer(map.getSize().divideBy(2));
    });
    map.on('resize', () => {
      if (this.#keyboardProbe) this.#setPointer(map.getSize().divideBy(2));
    });
    map.on('move zoom viewreset', () => {
      if (this.#marker !== null) this.#placeMarker();
    });
    // The map moving under a still pointer (wheel, keys, buttons) changes the pixel under it too.
    map.on('move', () => {
      if (this.#pointer !== null) this.#emitPointer();
      if (!this.#following && !this.#early) this.dispatchEvent(new CustomEvent('moving', { detail: this.view }));
    });
  }

  #createTiles(tileUrl, geometry, maskShapes) {
    const grid = {
      tileSize: 256,
      noWrap: true,
      bounds: this.#bounds,
      minZoom: MIN_ZOOM,
      maxZoom: geometry.maxZoom + ZOOM_PAST_NATIVE,
      minNativeZoom: 0,
      maxNativeZoom: geometry.maxZoom,
      keepBuffer: 2,
    };
    const layer = new TileLayer(tileUrl, { ...grid, className: 'image-tiles' });
    this.#mask = new MaskLayer(layer, { ...grid, geometry, shapes: maskShapes, pane: MASK_PANE, className: 'mask-tiles' }).addTo(this.#map);
    this.#compare = new CompareLayer(this.#map, this.#container, { ...grid, geometry });
    this.#compare.addEventListener('divider', (e) => this.dispatchEvent(new CustomEvent('divider', { detail: e.detail })));
    this.#compare.set(this.#compareSpec);
    return layer;
  }

  #markPastNative() {
    this.#container.classList.toggle('past-native', this.#map.getZoom() > this.#geometry.maxZoom);
  }

  #setKeyboardProbe(on) {
    this.#keyboardProbe = on;
    this.#container.classList.toggle('keyboard-probe', on);
  }

  #setPointer(containerPoint) {
    this.#pointer = containerPoint === null ? null : new Point(containerPoint.x, containerPoint.y);
    this.#emitPointer();
  }

  #emitPointer() {
    let detail = null;
    if (this.#pointer !== null) {
      const at = this.#map.containerPointToLatLng(this.#pointer);
      detail = { x: at.lng, y: at.lat };
    }
    this.dispatchEvent(new CustomEvent('pointer', { detail }));
  }
}
