// How the image area is used: one image, the three channel bands side by side, or two layers compared by a
// swipe divider or by blinking between them — two bands, or the composite and one band.
import { NumberField } from './number-field.js';
import { fillSelect } from './select-options.js';
import { BLINK_RANGE, COMPOSITE_LAYER, LAYOUT_DEFAULTS, normaliseLayout } from './layout-query.js';

/** Fires `change` with the new layout (normalised) in `detail`. */
export class LayoutControls extends EventTarget {
  #root;
  #views;
  #first;
  #second;
  #interval;
  #layout = normaliseLayout({});
  #layers = { first: null, second: null };

  constructor(root) {
    super();
    this.#root = root;
    this.#views = [...root.querySelectorAll('input[name=layout-view]')];
    this.#first = root.querySelector('#compare-first');
    this.#second = root.querySelector('#compare-second');
    this.#interval = new NumberField({
      label: 'Blink every (ms)', name: 'blink', min: BLINK_RANGE.min, max: BLINK_RANGE.max, log: true,
      accept: (n) => n >= BLINK_RANGE.min && n <= BLINK_RANGE.max,
    });
    root.querySelector('[data-role=blink-fields]').append(this.#interval.element);

    for (const radio of this.#views) {
      radio.addEventListener('change', () => {
        if (radio.checked) this.#emit({ view: radio.value === 'single' ? null : radio.value });
      });
    }
    this.#first.addEventListener('change', () => this.#emit({ first: this.#first.value }));
    this.#second.addEventListener('change', () => this.#emit({ second: this.#second.value }));
    this.#interval.addEventListener('value', (e) => this.#emit({ blink: e.detail }));
  }

  /**
   * Shows `layout`; `layers` ({first, second}) are the layers compared, defaults filled in; `choices` the bands
   * and whether a composite is on offer.
   */
  show(layout, layers, { bands, composite }) {
    this.#layout = layout;
    this.#layers = layers;
    const view = layout.view ?? 'single';
    for (const radio of this.#views) radio.checked = radio.value === view;
    this.#root.dataset.view = view;
    const entries = [
      ...(composite ? [{ value: COMPOSITE_LAYER, label: 'Colour composite' }] : []),
      ...bands.map((name) => ({ value: name, label: `Band ${name}` })),
    ];
    fillSelect(this.#first, entries, layers.first);
    fillSelect(this.#second, entries, layers.second);
    this.#interval.show(layout.blink ?? LAYOUT_DEFAULTS.blink);
  }

  #emit(change) {
    const next = normaliseLayout({ ...this.#layout, ...this.#layers, ...change });
    this.dispatchEvent(new CustomEvent('change', { detail: next }));
  }
}
