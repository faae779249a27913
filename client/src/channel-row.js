// One channel of a colour composite: which band it shows, its weight, and either its minimum (Lupton's composite)
// or its own low and high limits (each band on its own curve; empty boxes: the shared limits).
import { NumberField } from './number-field.js';
import { fillSelect } from './select-options.js';

const LABELS = Object.freeze({ red: 'Red', green: 'Green', blue: 'Blue' });

/**
 * Fires `change` with a part of the channel's settings in `detail`: {band}, {weight}, {min} or {lo, hi} (both
 * null: back to the shared limits).
 */
export class ChannelRow extends EventTarget {
  #element;
  #select;
  #weight;
  #min;
  #lo;
  #hi;
  #shared;

  constructor(channel) {
    super();
    const element = document.createElement('div');
    element.className = 'channel-row';
    element.dataset.channel = channel;
    const id = `channel-${channel}-band`;
    element.innerHTML = `
      <div class="picker channel-picker">
        <label for="${id}"><span class="channel-swatch channel-swatch-${channel}" aria-hidden="true"></span>${LABELS[channel]}</label>
        <select id="${id}" data-role="channel-band"></select>
      </div>
      <div class="field-row channel-numbers"></div>
      <button class="small-button" type="button" data-role="channel-shared" title="Use the limits of the Limits section for this channel">Shared limits</button>`;
    this.#element = element;
    this.#select = element.querySelector('select');
    this.#weight = new NumberField({ label: 'Weight', name: `${channel}-weight`, accept: (n) => n > 0 });
    this.#min = new NumberField({ label: 'Minimum', name: `${channel}-min` });
    this.#lo = new NumberField({ label: 'Low', name: `${channel}-lo` });
    this.#hi = new NumberField({ label: 'High', name: `${channel}-hi` });
    element.querySelector('.channel-numbers').append(this.#weight.element, this.#min.element, this.#lo.element, this.#hi.element);

    this.#shared = element.querySelector('[data-role=channel-shared]');
    this.#shared.addEventListener('click', () => this.#emit({ lo: null, hi: null }));
    this.#select.addEventListener('change', () => this.#emit({ band: this.#select.value }));
    this.#weight.addEventListener('value', (e) => this.#emit({ weight: e.detail }));
    this.#min.addEventListener('value', (e) => this.#emit({ min: e.detail }));
    const limits = () => {
      const [lo, hi] = [this.#lo.value, this.#hi.value];
      if (lo !== null && hi !== null && lo < hi) this.#emit({ lo, hi });
    };
    this.#lo.addEventListener('value', limits);
    this.#hi.addEventListener('value', limits);
  }

  get element() {
    return this.#element;
  }

  setBands(names, selected) {
    fillSelect(this.#select, names.map((name) => ({ value: name, label: name })), selected);
  }

  /**
   * Shows the channel in `mode` ("lupton" or "each"): its band, weight, minimum (asked for, else as resolved) and
   * limits (its own when `own`, else the shared ones as resolved for its band).
   */
  show(mode, { band, weight, min, lo, hi, own = false }) {
    this.#shared.hidden = mode !== 'each';
    this.#shared.disabled = !own;
    this.#select.value = band ?? '';
    this.#weight.show(weight);
    this.#min.hidden = mode !== 'lupton';
    this.#lo.hidden = mode !== 'each';
    this.#hi.hidden = mode !== 'each';
    this.#min.show(min ?? null);
    this.#lo.show(lo ?? null);
    this.#hi.show(hi ?? null);
  }

  #emit(part) {
    this.dispatchEvent(new CustomEvent('change', { detail: part }));
  }
}
