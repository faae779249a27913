// The band's histogram (field-wide, log counts) with the low and high limits drawn over it as two handles that can
// be dragged, or moved with the arrow keys, to set the limits as values.
import { debounce } from './debounce.js';
import { formatPixelValue } from './value-format.js';
import { roundNumber } from './display-query.js';

const DRAG_DEBOUNCE_MS = 100;
// Arrow keys move a handle by a hundredth of the drawn range, Page Up/Down by a tenth.
const KEY_STEP = 0.01;
const PAGE_STEP = 0.1;

/** Fires `limits` with {lo, hi} in `detail` while and after a handle is moved. */
export class HistogramView extends EventTarget {
  #root;
  #canvas;
  #handles;
  #caption;
  #data = null;
  #limits = null;
  #dragging = null;

  constructor(root) {
    super();
    this.#root = root;
    this.#canvas = root.querySelector('canvas');
    this.#caption = root.querySelector('[data-role=histogram-caption]');
    this.#handles = { lo: root.querySelector('[data-role=lo-handle]'), hi: root.querySelector('[data-role=hi-handle]') };
    const settle = debounce((limits) => this.#emit(limits), DRAG_DEBOUNCE_MS);
    for (const [which, handle] of Object.entries(this.#handles)) {
      handle.addEventListener('pointerdown', (event) => {
        if (this.#data === null || this.#limits === null) return;
        event.preventDefault();
        handle.setPointerCapture(event.pointerId);
        handle.focus();
        this.#dragging = which;
      });
      handle.addEventListener('pointermove', (event) => {
        if (this.#dragging !== which) return;
        const moved = this.#moveTo(which, this.#valueAt(event.clientX));
        if (moved) settle(this.#limits);
      });
      const release = () => {
        if (this.#dragging !== which) return;
        this.#dragging = null;
        settle.cancel();
        this.#emit(this.#limits);
      };
      handle.addEventListener('pointerup', release);
      handle.addEventListener('pointercancel', release);
      handle.addEventListener('keydown', (event) => {
        const steps = { ArrowLeft: -KEY_STEP, ArrowDown: -KEY_STEP, ArrowRight: KEY_STEP, ArrowUp: KEY_STEP, PageDown: -PAGE_STEP, PageUp: PAGE_STEP };
        if (!(event.key in steps) || this.#data === null || this.#limits === null) return;
        event.preventDefault();
        const span = this.#data.hi - this.#data.lo;
        if (this.#moveTo(which, this.#limits[which] + steps[event.key] * span)) settle(this.#limits);
      });
    }
    new ResizeObserver(() => this.#draw()).observe(this.#canvas);
  }

  /** The drawn range and its counts: the /histogram answer. */
  get range() {
    return this.#data === null ? null : { lo: this.#data.lo, hi: this.#data.hi };
  }

  get dragging() {
    return this.#dragging !== null;
  }

  setData(histogram) {
    this.#data = histogram;
    this.#root.dataset.ready = 'true';
    // The drawn range, for whoever reads the page (tests, assistive tools) rather than the bars.
    this.#root.dataset.lo = String(histogram.lo);
    this.#root.dataset.hi = String(histogram.hi);
    const unit = histogram.bunit ? ` ${histogram.bunit}` : '';
    this.#caption.textContent = `${formatPixelValue(histogram.lo)} to ${formatPixelValue(histogram.hi)}${unit}; `
      + `${histogram.below.toLocaleString('en')} below, ${histogram.above.toLocaleString('en')} above, `
      + `${histogram.masked.toLocaleString('en')} masked`;
    this.#draw();
  }

  clear(text = '') {
    this.#data = null;
    delete this.#root.dataset.ready;
    this.#caption.textContent = text;
    this.#draw();
  }

  /** The limits in use; ignored while a handle is held, so the server's echo does not fight the pointer. */
  setLimits(lo, hi) {
    if (this.#dragging !== null) return;
    this.#limits = { lo, hi };
    this.#draw();
  }

  #emit(limits) {
    this.dispatchEvent(new CustomEvent('limits', { detail: { ...limits } }));
  }

  #moveTo(which, value) {
    if (!Number.isFinite(value)) return false;
    const span = this.#data.hi - this.#data.lo;
    // The two limits never cross: a thousandth of the range apart at least.
    const gap = span / 1000;
    let v = roundNumber(value);
    if (which === 'lo') v = Math.min(v, this.#limits.hi - gap);
    else v = Math.max(v, this.#limits.lo + gap);
    v = roundNumber(v);
    if (v === this.#limits[which]) return false;
    this.#limits = { ...this.#limits, [which]: v };
    this.#draw();
    return true;
  }

  #valueAt(clientX) {
    const box = this.#canvas.getBoundingClientRect();
    const share = Math.min(1, Math.max(0, (clientX - box.left) / box.width));
    return this.#data.lo + share * (this.#data.hi - this.#data.lo);
  }

  #draw() {
    const canvas = this.#canvas;
    const scale = window.devicePixelRatio || 1;
    const width = Math.max(1, Math.round(canvas.clientWidth * scale));
    const height = Math.max(1, Math.round(canvas.clientHeight * scale));
    if (canvas.width !== width || canvas.height !== height) {
      canvas.width = width;
      canvas.height = height;
    }
    const context = canvas.getContext('2d');
    context.clearRect(0, 0, width, height);
    const styles = getComputedStyle(this.#root);
    const data = this.#data;
    for (const handle of Object.values(this.#handles)) handle.hidden = data === null || this.#limits === null;
    if (data === null) return;

    const counts = data.counts;
    // Log counts: a sky of millions of pixels and a star of a hundred both show.
    const heights = counts.map((c) => Math.log10(1 + c));
    const top = Math.max(...heights, 1e-9);
    const limits = this.#limits;
    const span = data.hi - data.lo;
    const xOf = (value) => ((value - data.lo) / span) * width;
    const inside = styles.getPropertyValue('--histogram-inside').trim() || '#c8c2b6';
    const outside = styles.getPropertyValue('--histogram-outside').trim() || '#5c5851';
    const binWidth = width / counts.length;
    heights.forEach((h, i) => {
      const barHeight = (h / top) * (height - 2);
      const centre = data.lo + (i + 0.5) * (span / counts.length);
      context.fillStyle = limits !== null && centre >= limits.lo && centre <= limits.hi ? inside : outside;
      context.fillRect(i * binWidth, height - barHeight, Math.max(binWidth, 1 * scale), barHeight);
    });
    if (limits === null) return;
    for (const [which, handle] of Object.entries(this.#handles)) {
      const value = limits[which];
      const share = Math.min(1, Math.max(0, (value - data.lo) / span));
      handle.style.left = `${share * 100}%`;
      handle.dataset.value = String(value);
      handle.setAttribute('aria-valuenow', String(value));
      handle.setAttribute('aria-valuemin', String(data.lo));
      handle.setAttribute('aria-valuemax', String(data.hi));
      handle.setAttribute('aria-valuetext', formatPixelValue(value));
      handle.dataset.outside = String(value < data.lo || value > data.hi);
    }
    context.fillStyle = styles.getPropertyValue('--accent').trim() || '#c68a3a';
    for (const value of [limits.lo, limits.hi]) {
      const x = Math.min(width - scale, Math.max(0, xOf(value)));
      context.fillRect(x - scale / 2, 0, scale, height);
    }
  }
}
