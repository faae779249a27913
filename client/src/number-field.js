// One number with a slider and a box kept in step: the slider for a quick feel, the box for an exact value. On a
// logarithmic slider the track is in log10 of the value, so a wide range (a softening of 0.01 to 1000) stays usable.
import { debounce } from './debounce.js';
import { formatPixelValue } from './value-format.js';

const SLIDER_STEPS = 1000;
const SLIDER_DEBOUNCE_MS = 100;

let counter = 0;

/**
 * Fires `value` with the number in `detail` when the person settles on one: after the slider has paused for
 * ~100 ms, or when the box is committed (Enter, leaving it). Values set from outside fire nothing.
 */
export class NumberField extends EventTarget {
  #element;
  #slider;
  #box;
  #options;
  #value = null;

  /** options: {label, name, min, max (slider range; no slider without them), log, accept(n) (what the box takes)} */
  constructor(options) {
    super();
    this.#options = options;
    const id = `number-field-${++counter}`;
    const element = document.createElement('div');
    element.className = 'number-field';
    element.innerHTML = `
      <label class="number-field-label" for="${id}-box"></label>
      <input class="number-field-slider" type="range" min="0" max="${SLIDER_STEPS}" step="1">
      <input class="number-field-box" id="${id}-box" type="text" inputmode="decimal" autocomplete="off" spellcheck="false">`;
    element.querySelector('label').textContent = options.label;
    element.querySelector('.number-field-slider').setAttribute('aria-label', `${options.label} (slider)`);
    this.#element = element;
    this.#slider = element.querySelector('.number-field-slider');
    if (options.min === undefined) {
      this.#slider.remove();
      element.classList.add('number-field-plain');
    }
    this.#box = element.querySelector('.number-field-box');
    if (options.name) this.#box.dataset.param = options.name;
    if (options.title) this.#box.title = options.title;

    const settle = debounce((value) => this.#emit(value), SLIDER_DEBOUNCE_MS);
    this.#slider.addEventListener('input', () => {
      const value = this.#fromSlider(Number(this.#slider.value));
      this.#value = value;
      this.#box.value = formatPixelValue(value);
      this.#box.removeAttribute('aria-invalid');
      settle(value);
    });
    this.#box.addEventListener('change', () => this.#commitBox());
    this.#box.addEventListener('keydown', (event) => {
      if (event.key === 'Enter') this.#commitBox();
    });
  }

  get element() {
    return this.#element;
  }

  get value() {
    return this.#value;
  }

  /** True while the person is typing in the box: a value from the server must not overwrite that. */
  get editing() {
    return document.activeElement === this.#box;
  }

  set hidden(hidden) {
    this.#element.hidden = hidden;
  }

  /** Shows `value` (null: empty) without firing; a value outside the slider's range pins the slider to its end. */
  show(value) {
    this.#value = value;
    if (this.editing) return;
    this.#box.value = value === null ? '' : formatPixelValue(value);
    this.#box.removeAttribute('aria-invalid');
    if (value !== null) this.#slider.value = String(this.#toSlider(value));
  }

  /** A new slider range (for parameters in physical units, which follow the band). */
  setRange(min, max) {
    if (!(min < max)) return;
    this.#options = { ...this.#options, min, max };
    if (this.#value !== null) this.#slider.value = String(this.#toSlider(this.#value));
  }

  #commitBox() {
    const text = this.#box.value.trim();
    const value = Number(text);
    if (text === '' || !Number.isFinite(value) || !(this.#options.accept?.(value) ?? true)) {
      this.#box.setAttribute('aria-invalid', 'true');
      return;
    }
    this.#box.removeAttribute('aria-invalid');
    if (value === this.#value) return;
    this.#value = value;
    this.#slider.value = String(this.#toSlider(value));
    this.#emit(value);
  }

  #emit(value) {
    this.dispatchEvent(new CustomEvent('value', { detail: value }));
  }

  #toSlider(value) {
    const { min, max, log } = this.#options;
    const [a, b, v] = log ? [Math.log10(min), Math.log10(max), Math.log10(Math.max(value, min))] : [min, max, value];
    const share = Math.min(1, Math.max(0, (v - a) / (b - a)));
    return Math.round(share * SLIDER_STEPS);
  }

  #fromSlider(step) {
    const { min, max, log } = this.#options;
    const share = step / SLIDER_STEPS;
    const value = log ? 10 ** (Math.log10(min) + share * (Math.log10(max) - Math.log10(min))) : min + share * (max - min);
    // Three significant digits: a slider is not for exact values, and short numbers keep links short.
    return Number(value.toPrecision(3));
  }
}
