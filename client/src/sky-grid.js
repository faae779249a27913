// The coordinate grid over the image: lines of constant RA and Dec as the server traced them, in map (FITS pixel)
// coordinates so they pan and zoom with the image, cut to the image's edges, each labelled where the server put
// its label (a label that would overlap one already placed is left out). A new grid replaces the old one only
// once it has arrived, so panning never blanks or flickers the grid.
import { LayerGroup, Polyline, Marker, DivIcon } from 'leaflet';
import { toLatLng } from './pixel-crs.js';
import { clipPolyline } from './clip-polyline.js';

// Screen pixels kept clear between two labels.
const LABEL_GAP = 4;

export class SkyGrid {
  #view;
  #layer = new LayerGroup();
  #labels = [];
  #on = false;
  #grid = null;
  #bounds = null;

  /** `view` is the ImageView the grid is drawn over. */
  constructor(view) {
    this.#view = view;
    // Zooming changes the labels' distances on screen, not their size.
    view.addEventListener('viewchange', () => this.#spaceLabels());
  }

  get on() {
    return this.#on;
  }

  set on(value) {
    if (value === this.#on) return;
    this.#on = value;
    if (value) {
      this.#view.addOverlay(this.#layer);
      this.#draw();
    } else {
      this.#view.removeOverlay(this.#layer);
      this.#layer.clearLayers();
      this.#labels = [];
    }
  }

  /**
   * The `grid` of a /sky answer ({raStep, decStep, lines}), or null to show none, over an image of
   * `width` x `height` pixels.
   */
  show(grid, width = null, height = null) {
    this.#grid = grid;
    this.#bounds = width === null ? null : { x0: 0.5, y0: 0.5, x1: width + 0.5, y1: height + 0.5 };
    if (this.#on) this.#draw();
  }

  #draw() {
    this.#layer.clearLayers();
    this.#labels = [];
    for (const line of this.#grid?.lines ?? []) {
      const segments = line.segments
        .flatMap((segment) => (this.#bounds === null ? [segment] : clipPolyline(segment, this.#bounds)))
        .filter((segment) => segment.length >= 2)
        .map((segment) => segment.map(toLatLng));
      if (segments.length > 0) {
        const polyline = new Polyline(segments, {
          className: `sky-grid-line sky-grid-${line.axis}`,
          interactive: false,
          weight: 1,
          // The server already sampled the curve to half a screen pixel; no further thinning.
          smoothFactor: 0,
        });
        // What the line is, on its SVG path, for tools and tests reading the page.
        polyline.on('add', () => Object.assign(polyline.getElement().dataset, { axis: line.axis, value: String(line.value) }));
        this.#layer.addLayer(polyline);
      }
      if (line.labelAt) {
        const { marker, text } = label(line);
        this.#labels.push(text);
        this.#layer.addLayer(marker);
      }
    }
    this.#spaceLabels();
  }

  #spaceLabels() {
    const kept = [];
    for (const text of this.#labels) {
      text.hidden = false;
      if (!text.isConnected) continue;
      const box = text.getBoundingClientRect();
      if (kept.some((other) => overlap(box, other))) text.hidden = true;
      else kept.push(box);
    }
  }
}

function overlap(a, b) {
  return a.left < b.right + LABEL_GAP && b.left < a.right + LABEL_GAP && a.top < b.bottom + LABEL_GAP && b.top < a.bottom + LABEL_GAP;
}

function label(line) {
  const text = document.createElement('span');
  text.className = `sky-grid-label sky-grid-label-${line.axis}`;
  text.textContent = line.label;
  text.dataset.axis = line.axis;
  text.dataset.value = String(line.value);
  // Zero size, anchored at the point: CSS centres the text on it.
  const icon = new DivIcon({ className: 'sky-grid-label-anchor', iconSize: [0, 0], html: text });
  return { marker: new Marker(toLatLng(line.labelAt), { icon, interactive: false, keyboard: false }), text };
}
