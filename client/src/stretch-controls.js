// The tone curve: which transfer function maps a value between the limits to a brightness, and its parameters.
import { NumberField } from './number-field.js';
import { DEFAULTS, STRETCHES } from './display-query.js';

const LABELS = Object.freeze({
  linear: 'Linear', sqrt: 'Square root', power: 'Power', log: 'Logarithmic', asinh: 'asinh', histeq: 'Equalised',
});

// What the server draws when no curve is named (display contract).
const DEFAULT_STRETCH = 'asinh';

const positive = (n) => n > 0;

/** Fires `change` with the curve's part of the settings ({stretch, gamma, a, soft, pivot}) in `detail`. */
export class StretchControls extends EventTarget {
  #picker;
  #gamma;
  #a;
  #soft;
  #pivotPicker;
  #pivotValue;
  #pivotRow;
  #current = { stretch: null, gamma: null, a: null, soft: null, pivot: null };

  constructor(root) {
    super();
    this.#picker = root.querySelector('#stretch-picker');
    this.#picker.replaceChildren(...STRETCHES.map((name) => new Option(LABELS[name], name)));
    this.#gamma = new NumberField({ label: 'Exponent γ', name: 'gamma', min: 0.1, max: 5, log: true, accept: positive });
    this.#a = new NumberField({ label: 'Steepness a', name: 'a', min: 1, max: 1e5, log: true, accept: positive });
    this.#soft = new NumberField({
      label: 'Softening', name: 'soft', min: 1e-3, max: 1e3, log: true, accept: positive,
      title: 'Below about this distance from the pivot the curve is nearly linear; far above it, logarithmic.',
    });
    this.#pivotValue = new NumberField({ label: 'Pivot value', name: 'pivot' });
    const fields = root.querySelector('[data-role=stretch-fields]');
    fields.append(this.#gamma.element, this.#a.element, this.#soft.element);
    this.#pivotRow = root.querySelector('[data-role=pivot-row]');
    this.#pivotPicker = root.querySelector('#pivot-picker');
    this.#pivotRow.append(this.#pivotValue.element);

    this.#picker.addEventListener('change', () => this.#emit({ stretch: this.#picker.value }));
    this.#gamma.addEventListener('value', (e) => this.#emit({ gamma: e.detail }));
    this.#a.addEventListener('value', (e) => this.#emit({ a: e.detail }));
    this.#soft.addEventListener('value', (e) => this.#emit({ soft: e.detail }));
    this.#pivotValue.addEventListener('value', (e) => this.#emit({ pivot: e.detail }));
    this.#pivotPicker.addEventListener('change', () => {
      const choice = this.#pivotPicker.value;
      if (choice !== 'value') {
        this.#emit({ pivot: choice });
        return;
      }
      // A value pivot starts where the resolved pivot is, then the box takes over.
      this.#pivotValue.hidden = false;
      if (this.#pivotValue.value !== null) this.#emit({ pivot: this.#pivotValue.value });
    });
    this.show(this.#current, null);
  }

  /** Slider range of the softening, in physical units: from a tiny to a huge share of the band's noise. */
  setNoise(sigma, span) {
    const scale = sigma > 0 ? sigma : span / 100;
    if (scale > 0 && Number.isFinite(scale)) this.#soft.setRange(scale / 100, scale * 1000);
  }

  /** Shows `display` (the settings asked for) filled in with `resolved` (the server's answer for them, or null). */
  show(display, resolved) {
    this.#current = {
      stretch: display.stretch, gamma: display.gamma, a: display.a, soft: display.soft, pivot: display.pivot,
    };
    const stretch = display.stretch ?? DEFAULT_STRETCH;
    this.#picker.value = stretch;
    const params = resolved?.stretch ?? {};
    this.#gamma.hidden = stretch !== 'power';
    this.#a.hidden = stretch !== 'log';
    this.#soft.hidden = stretch !== 'asinh';
    this.#pivotRow.hidden = stretch !== 'asinh';
    this.#gamma.show(display.gamma ?? numberOr(params.gamma, DEFAULTS.gamma));
    this.#a.show(display.a ?? numberOr(params.a, DEFAULTS.a));
    this.#soft.show(display.soft ?? numberOr(params.soft, null));
    const pivot = display.pivot ?? 'lo';
    const kind = typeof pivot === 'number' ? 'value' : pivot;
    if (document.activeElement !== this.#pivotPicker) this.#pivotPicker.value = kind;
    this.#pivotValue.hidden = kind !== 'value' && this.#pivotPicker.value !== 'value';
    this.#pivotValue.show(typeof pivot === 'number' ? pivot : numberOr(params.pivot, null));
  }

  #emit(change) {
    const next = { ...this.#current, ...change };
    this.dispatchEvent(new CustomEvent('change', { detail: next }));
  }
}

function numberOr(value, fallback) {
  return typeof value === 'number' && Number.isFinite(value) ? value : fallback;
}
