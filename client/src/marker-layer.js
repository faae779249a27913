// The markers drawn over the image: each marker on the sky is looked up on the image shown (the probe's position
// on that chip or on the whole field, then the /sky answer at that point for its size and orientation); a marker in
// pixels shows only on the HDU it was placed on. Answers are kept per image, so a pan asks nothing again.
import { Layer, LayerGroup, Marker, DivIcon, Polygon } from 'leaflet';
import { probePosition, getSky } from './api.js';
import { markerAxes, markerOutline } from './marker-shape.js';
import { toLatLng } from './pixel-crs.js';
import { WHOLE_FIELD, isWholeField } from './whole-field.js';

// Image pixels each way around a marker for the /sky request that sizes it: small, so north, east and the scale
// are those at the marker itself.
const SKY_BOX = 4;

// A Leaflet layer that holds the drawn markers and reports clicks on the map (a click, not the end of a drag).
const MarkerOverlay = Layer.extend({
  initialize(onClick) {
    this._group = new LayerGroup();
    this._onClick = onClick;
  },
  onAdd(map) {
    this._group.addTo(map);
    map.on('click', this._onClick);
  },
  onRemove(map) {
    map.off('click', this._onClick);
    this._group.remove();
  },
});

function sourceKey(source) {
  return source === null ? '' : `${source.field}|${source.band}|${source.hdu}`;
}

function skyKey(marker) {
  return `${marker.ra}|${marker.dec}`;
}

/**
 * Fires `pick` ({x, y}: FITS pixels of the image shown) on a click over the map while `armed`, and `placed` (the
 * placements, see `placements`) each time every marker has been looked up on the image shown.
 */
export class MarkerLayer extends EventTarget {
  #container;
  #overlay;
  #source = null;
  #markers = [];
  #placements = [];
  // sky key -> Promise of {x, y, local} or {why}: for the image in #source only.
  #lookups = new Map();
  #generation = 0;
  #armed = false;

  /** Draws over `imageView`, whose element is `container`. */
  constructor(imageView, container) {
    super();
    this.#container = container;
    this.#overlay = new MarkerOverlay((event) => {
      if (!this.#armed) return;
      this.dispatchEvent(new CustomEvent('pick', { detail: { x: event.latlng.lng, y: event.latlng.lat } }));
    });
    imageView.addOverlay(this.#overlay);
  }

  /** Whether a click on the image places a marker (the panel's click tool). */
  set armed(on) {
    this.#armed = on;
    this.#container.classList.toggle('placing-marker', on);
  }

  get armed() {
    return this.#armed;
  }

  /** The image shown: {field, band, hdu, sky}, `sky` whether it has a celestial WCS; null while there is none. */
  setSource(source) {
    if (sourceKey(source) === sourceKey(this.#source) && source?.sky === this.#source?.sky) return;
    this.#source = source;
    this.#lookups.clear();
    this.show(this.#markers);
  }

  get source() {
    return this.#source;
  }

  /**
   * Where each marker is on the image shown, in marker order: {marker, on, x, y, outline, why}. `on` says whether it
   * lies on this image; x, y (FITS pixels) and `outline` ([[x, y], ...], [] for a point) are set when it does,
   * `why` says why not otherwise.
   */
  get placements() {
    return this.#placements;
  }

  /** Draws `markers` (normalised, marker-query.js) on the image shown. */
  async show(markers) {
    this.#markers = markers;
    const generation = ++this.#generation;
    const source = this.#source;
    const placements = await Promise.all(markers.map((marker) => this.#place(marker, source)));
    if (generation !== this.#generation) return;
    this.#placements = placements;
    this.#draw();
    this.dispatchEvent(new CustomEvent('placed', { detail: placements }));
  }

  async #place(marker, source) {
    if (source === null) return { marker, on: false, why: 'no image is shown' };
    if (!marker.sky) {
      if (marker.hdu !== source.hdu) {
        const where = isWholeField(marker.hdu) ? 'the whole field' : `HDU ${marker.hdu}`;
        return { marker, on: false, why: `in pixels of ${where}` };
      }
      return { marker, on: true, x: marker.x, y: marker.y, outline: markerOutline(marker, marker.x, marker.y, markerAxes(marker, null)) };
    }
    if (!source.sky) return { marker, on: false, why: 'this image has no sky coordinates' };
    const found = await this.#lookup(marker, source);
    if (found.why) return { marker, on: false, why: found.why };
    const axes = markerAxes(marker, found.local);
    if (axes === null && marker.kind !== 'point') return { marker, on: false, why: 'no sky scale at this position' };
    return { marker, on: true, x: found.x, y: found.y, outline: axes === null ? [] : markerOutline(marker, found.x, found.y, axes) };
  }

  #lookup(marker, source) {
    const key = skyKey(marker);
    let promise = this.#lookups.get(key);
    if (promise === undefined) {
      promise = this.#ask(marker, source);
      this.#lookups.set(key, promise);
    }
    return promise;
  }

  async #ask(marker, source) {
    const wholeField = isWholeField(source.hdu);
    try {
      // The go-to box's path: the server parses the position and finds the chip holding it (or its place on the
      // whole field). Asked of the whole band, so a marker on another chip is an answer naming that chip, not an error.
      const answer = await probePosition({ field: source.field, band: source.band, hdu: wholeField ? WHOLE_FIELD : null },
        `${marker.ra} ${marker.dec}`);
      if (!wholeField && answer.hdu !== source.hdu) return { why: `on ${answer.hduName ?? `HDU ${answer.hdu}`}, not on this chip` };
      const at = wholeField ? answer.canvas : { x: answer.atX, y: answer.atY };
      if (!at || !Number.isFinite(at.x) || !Number.isFinite(at.y)) return { why: 'not on this image' };
      const box = { x0: at.x - SKY_BOX, x1: at.x + SKY_BOX, y0: at.y - SKY_BOX, y1: at.y + SKY_BOX, width: 2 * SKY_BOX, height: 2 * SKY_BOX };
      const sky = await getSky(source, box);
      return { x: at.x, y: at.y, local: { north: sky.north, east: sky.east, pixelScale: sky.pixelScale } };
    } catch (error) {
      // Off every chip is a 404 with the server's reason; anything else is said as it is.
      return { why: error.status === 404 ? 'on no image of this band' : error.detail || error.message };
    }
  }

  #draw() {
    const group = this.#overlay._group;
    group.clearLayers();
    this.#placements.forEach((placement, index) => {
      if (!placement.on) return;
      const { marker, x, y, outline } = placement;
      if (outline.length > 0) {
        group.addLayer(new Polygon(outline.map(toLatLng), {
          className: `mark-shape mark-${marker.kind}`, interactive: false, fill: false, weight: 2,
        }));
      }
      group.addLayer(this.#anchor(placement, index));
      if (marker.label !== '' && outline.length > 0) {
        // Above the shape's highest point on screen, so the label never hides what the shape encloses.
        const top = outline.reduce((best, point) => (point[1] > best[1] ? point : best), outline[0]);
        group.addLayer(this.#label(marker.label, [top[1], x], 'mark-label mark-label-above'));
      }
    });
  }

  // At the centre: a cross for a point, a small dot for the others; carries the position for anyone reading the page.
  #anchor({ marker, x, y, outline }, index) {
    const point = marker.kind === 'point';
    const size = point ? 17 : 5;
    const icon = new DivIcon({
      className: `mark-anchor mark-anchor-${marker.kind}`,
      iconSize: [size, size],
      iconAnchor: [size / 2, size / 2],
      html: point && marker.label !== '' ? '<span class="mark-label mark-label-beside"></span>' : '',
    });
    const layer = new Marker([y, x], { icon, interactive: false, keyboard: false, zIndexOffset: 900 });
    layer.on('add', () => {
      const element = layer.getElement();
      element.dataset.index = String(index);
      element.dataset.x = String(x);
      element.dataset.y = String(y);
      element.dataset.outline = JSON.stringify(outline);
      const label = element.querySelector('.mark-label');
      if (label) label.textContent = marker.label;
    });
    return layer;
  }

  #label(text, latLng, className) {
    const icon = new DivIcon({ className: 'mark-label-holder', iconSize: [0, 0], iconAnchor: [0, 0], html: `<span class="${className}"></span>` });
    const layer = new Marker(latLng, { icon, interactive: false, keyboard: false, zIndexOffset: 900 });
    layer.on('add', () => {
      layer.getElement().querySelector('span').textContent = text;
    });
    return layer;
  }
}
