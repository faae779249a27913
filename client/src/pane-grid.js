// The three channel bands of one chip side by side, each in its own map with its own palette. Panning or zooming
// any of them moves the others to the same place; pointing at a pixel in one marks it in the others and shows its
// value in every band, each under its own pane.
import { ImageView } from './image-view.js';
import { PixelReadout } from './pixel-readout.js';
import { tileUrlTemplate } from './api.js';
import { normaliseDisplay } from './display-query.js';
import { CHANNELS } from './colour-query.js';
import { fillSelect } from './select-options.js';
import { isWholeField } from './whole-field.js';

const CHANNEL_LABELS = Object.freeze({ red: 'Red', green: 'Green', blue: 'Blue' });
const DEFAULT_PALETTE = 'gray';

function readoutMarkup(element) {
  element.className = 'pixel-readout pane-readout';
  element.setAttribute('role', 'status');
  element.setAttribute('aria-live', 'off');
  element.innerHTML = `
    <span class="readout-hdu" data-role="hdu">–</span>
    <span class="readout-pair">x <span class="readout-number" data-role="x">–</span></span>
    <span class="readout-pair">y <span class="readout-number" data-role="y">–</span></span>
    <span class="readout-value" data-role="value">–</span>`;
}

/**
 * Fires `viewchange` ({x, y, z}) when a pan or zoom of any pane ends, and `palette` ({channel, palette}) when a
 * pane's palette is picked.
 */
export class PaneGrid extends EventTarget {
  #root;
  #panes;
  #view = null;

  constructor(root) {
    super();
    this.#root = root;
    this.#panes = CHANNELS.map((channel) => this.#createPane(channel));
  }

  get visible() {
    return !this.#root.hidden;
  }

  /** The centre and zoom the panes share, or null before they show anything. */
  get view() {
    return this.#view;
  }

  /** The palettes the server offers ([{name, label}]), for each pane's palette picker. */
  setPalettes(palettes) {
    for (const pane of this.#panes) {
      const current = pane.select.value || pane.palette;
      fillSelect(pane.select, palettes.map((p) => ({ value: p.name, label: p.label ?? p.name })), current);
    }
  }

  /**
   * Shows `panes` ([{channel, band, hdu: {index, name, width, height, maxZoom, chips}, palette}], red first) of `field`
   * with the shared `display` settings, at `view` ({x, y, z}) or where the panes already are.
   */
  show(field, panes, display, view = null) {
    this.#root.hidden = false;
    const start = view ?? this.#view;
    panes.forEach((spec, i) => {
      const pane = this.#panes[i];
      const source = { field, band: spec.band, hdu: spec.hdu.index };
      pane.palette = spec.palette ?? DEFAULT_PALETTE;
      if (pane.select.options.length > 0) pane.select.value = pane.palette;
      pane.title.textContent = spec.band;
      pane.element.title = `${CHANNEL_LABELS[spec.channel]} channel: band ${spec.band}`;
      const tileUrl = tileUrlTemplate(source, normaliseDisplay({ ...display, palette: pane.palette }));
      const shows = `${field}\u0000${spec.band}\u0000${spec.hdu.index}`;
      if (pane.shows === shows && view === null) {
        // The same image drawn another way: each tile keeps its picture until the new one has come.
        pane.view.restyle(tileUrl);
        return;
      }
      pane.shows = shows;
      // On the whole field, as in the single view: the masked colour only inside the chips, the chip named per point.
      const wholeField = isWholeField(spec.hdu.index);
      const maskShapes = wholeField ? spec.hdu.chips.map((chip) => chip.outline) : null;
      pane.view.show({ tileUrl, width: spec.hdu.width, height: spec.hdu.height, maxZoom: spec.hdu.maxZoom, maskShapes }, start);
      pane.readout.setSource({ ...source, hduName: spec.hdu.name, width: spec.hdu.width, height: spec.hdu.height, wholeField });
    });
    this.#view = this.#panes[0].view.view;
  }

  hide() {
    this.#root.hidden = true;
    // Shown again, the panes start where the single view is.
    for (const pane of this.#panes) pane.shows = null;
  }

  #createPane(channel) {
    const element = document.createElement('section');
    element.className = 'pane';
    element.dataset.pane = channel;
    element.setAttribute('aria-label', `${CHANNEL_LABELS[channel]} channel`);
    const header = document.createElement('header');
    header.className = 'pane-header';
    const swatch = document.createElement('span');
    swatch.className = `pane-swatch pane-swatch-${channel}`;
    swatch.textContent = CHANNEL_LABELS[channel];
    const title = document.createElement('span');
    title.className = 'pane-title';
    title.dataset.role = 'pane-band';
    const select = document.createElement('select');
    select.className = 'pane-palette';
    select.dataset.role = 'pane-palette';
    select.setAttribute('aria-label', `Palette of the ${CHANNEL_LABELS[channel].toLowerCase()} channel's pane`);
    header.append(swatch, title, select);
    const container = document.createElement('div');
    container.className = 'image-view pane-view';
    container.tabIndex = 0;
    container.setAttribute('role', 'region');
    container.setAttribute('aria-label', `${CHANNEL_LABELS[channel]} channel image. Arrow keys pan, plus and minus zoom.`);
    const readoutElement = document.createElement('div');
    readoutMarkup(readoutElement);
    element.append(header, container, readoutElement);
    this.#root.append(element);

    const pane = {
      channel, element, title, select, palette: DEFAULT_PALETTE, shows: null,
      view: new ImageView(container), readout: new PixelReadout(readoutElement),
    };
    select.addEventListener('change', () => {
      this.dispatchEvent(new CustomEvent('palette', { detail: { channel, palette: select.value } }));
    });
    pane.view.addEventListener('moving', (event) => {
      this.#view = event.detail;
      for (const other of this.#panes) if (other !== pane) other.view.follow(event.detail);
    });
    pane.view.addEventListener('viewchange', (event) => {
      this.#view = event.detail;
      this.dispatchEvent(new CustomEvent('viewchange', { detail: event.detail }));
    });
    // One pixel pointed at in any pane is read in every band.
    pane.view.addEventListener('pointer', (event) => {
      for (const each of this.#panes) {
        each.readout.pointAt(event.detail);
        each.view.setMarker(each === pane ? null : event.detail);
      }
    });
    return pane;
  }
}
