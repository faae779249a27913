// The chips of the whole field drawn over it: each chip's edge as the server traced it onto the canvas (a closed
// polygon in canvas pixels, sampled along the edge so distortion shows), and its name in the middle. Map
// coordinates, so they pan and zoom with the image. A name wider than its chip on screen (zoomed far out) is left
// out rather than spill over the next chip's.
import { LayerGroup, Polygon, Marker, DivIcon } from 'leaflet';
import { toLatLng } from './pixel-crs.js';

// Screen pixels a name keeps clear of its chip's sides.
const LABEL_MARGIN = 6;

// The mean of the outline's points: inside any chip outline, which is close to a rectangle.
function middle(outline) {
  const sum = outline.reduce(([sx, sy], [x, y]) => [sx + x, sy + y], [0, 0]);
  return [sum[0] / outline.length, sum[1] / outline.length];
}

function outlineLayer(chip) {
  const polygon = new Polygon(chip.outline.map(toLatLng), {
    className: 'chip-outline',
    interactive: false,
    weight: 1.5,
    fill: false,
    // The server sampled the edge finely enough; thinning would straighten the curve it traced.
    smoothFactor: 0,
  });
  // Which chip it is, on its SVG path, for tools and tests reading the page.
  polygon.on('add', () => Object.assign(polygon.getElement().dataset, { hdu: String(chip.hdu), name: chip.name }));
  return polygon;
}

function chipWidth(outline) {
  const xs = outline.map(([x]) => x);
  return Math.max(...xs) - Math.min(...xs);
}

function nameLayer(chip) {
  const text = document.createElement('span');
  text.className = 'chip-outline-label';
  text.textContent = chip.name;
  text.dataset.hdu = String(chip.hdu);
  // Zero size, anchored at the point: CSS centres the text on it.
  const icon = new DivIcon({ className: 'chip-outline-label-anchor', iconSize: [0, 0], html: text });
  const marker = new Marker(toLatLng(middle(chip.outline)), { icon, interactive: false, keyboard: false });
  return { marker, text, width: chipWidth(chip.outline) };
}

export class ChipOutlines {
  #view;
  #layer = new LayerGroup();
  #on = false;
  #chips = [];
  #names = [];

  /** `view` is the ImageView the outlines are drawn over. */
  constructor(view) {
    this.#view = view;
    view.addEventListener('viewchange', () => this.#fitNames());
    // A new map adds its layers only once it has a view, after that view's own change event.
    this.#layer.on('add', () => this.#fitNames());
  }

  get on() {
    return this.#on;
  }

  set on(value) {
    if (value === this.#on) return;
    this.#on = value;
    if (value) {
      this.#view.addOverlay(this.#layer);
      this.#fitNames();
    } else {
      this.#view.removeOverlay(this.#layer);
    }
  }

  /** The placed chips of the whole field shown (`canvas.chips` of the field list), or [] on a single chip. */
  show(chips) {
    this.#chips = chips ?? [];
    this.#layer.clearLayers();
    this.#names = [];
    for (const chip of this.#chips) {
      if (!Array.isArray(chip.outline) || chip.outline.length < 3) continue;
      this.#layer.addLayer(outlineLayer(chip));
      const name = nameLayer(chip);
      this.#names.push(name);
      this.#layer.addLayer(name.marker);
    }
    this.#fitNames();
  }

  #fitNames() {
    const scale = this.#view.screen?.scale;
    if (!this.#on || !Number.isFinite(scale)) return;
    for (const { text, width } of this.#names) {
      text.hidden = false;
      if (text.isConnected) text.hidden = text.offsetWidth + 2 * LABEL_MARGIN > width * scale;
    }
  }
}
