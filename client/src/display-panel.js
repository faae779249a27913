// The display panel: tone curve, limits, histogram, palette, masked colour and colour bar, in one collapsible side
// panel. It shows the settings it is given and reports the settings asked for; it asks the server nothing itself.
import { normaliseDisplay } from './display-query.js';
import { StretchControls } from './stretch-controls.js';
import { LimitControls } from './limit-controls.js';
import { PaletteControls } from './palette-controls.js';
import { HistogramView } from './histogram-view.js';
import { ColourBar } from './colour-bar.js';

/**
 * Fires `change` with the new display settings in `detail` (normalised, as the view state keeps them), and
 * `fit-view` when the limits are to be taken from the pixels on screen.
 */
export class DisplayPanel extends EventTarget {
  #root;
  #toggle;
  #status;
  #display = normaliseDisplay({});
  #resolved = null;

  constructor(root, { defaultMask }) {
    super();
    this.#root = root;
    this.#toggle = root.querySelector('#display-panel-toggle');
    this.#status = root.querySelector('[data-role=display-status]');
    this.stretch = new StretchControls(root.querySelector('[data-role=stretch-section]'));
    this.limits = new LimitControls(root.querySelector('[data-role=limits-section]'));
    this.palette = new PaletteControls(root.querySelector('[data-role=palette-section]'), defaultMask);
    this.histogram = new HistogramView(root.querySelector('[data-role=histogram]'));
    this.colourBar = new ColourBar(root.querySelector('[data-role=colour-bar]'));

    this.#toggle.addEventListener('click', () => this.#setOpen(this.#toggle.getAttribute('aria-expanded') !== 'true'));
    this.stretch.addEventListener('change', (e) => this.#change(e.detail));
    this.limits.addEventListener('change', (e) => this.#change(e.detail));
    this.palette.addEventListener('change', (e) => this.#change(e.detail));
    this.palette.addEventListener('masked', (e) => this.#change({ masked: e.detail }));
    this.histogram.addEventListener('limits', (e) => this.#change({
      limits: 'value', lo: e.detail.lo, hi: e.detail.hi, plo: null, phi: null, klo: null, khi: null,
    }));
    this.limits.addEventListener('fit-view', () => this.dispatchEvent(new CustomEvent('fit-view')));
    // Narrow windows start with the panel closed, so the image keeps the room.
    this.#setOpen(window.matchMedia('(min-width: 900px)').matches);
  }

  get display() {
    return this.#display;
  }

  /** Shows `display`; `resolved` is the server's answer for it once it has come (null until then). */
  show(display, resolved = null) {
    this.#display = display;
    this.#resolved = resolved;
    this.stretch.show(display, resolved);
    this.limits.show(display, resolved);
    this.palette.show(display);
    this.palette.showMask(display.masked);
    if (resolved !== null) {
      this.histogram.setLimits(resolved.lo, resolved.hi);
      this.colourBar.show(resolved);
      if (resolved.palette?.name) this.palette.showResolvedColours(resolved.palette.name, resolved.colorbar?.colors);
    } else if (display.lo !== null && display.hi !== null) {
      this.histogram.setLimits(display.lo, display.hi);
    }
  }

  get resolved() {
    return this.#resolved;
  }

  /** One line under the panel's heading: what went wrong asking the server, or nothing. */
  setStatus(text) {
    this.#status.textContent = text ?? '';
    this.#status.hidden = !text;
  }

  #change(part) {
    const next = normaliseDisplay({ ...this.#display, ...part });
    this.dispatchEvent(new CustomEvent('change', { detail: next }));
  }

  #setOpen(open) {
    this.#toggle.setAttribute('aria-expanded', String(open));
    this.#root.classList.toggle('collapsed', !open);
  }
}
