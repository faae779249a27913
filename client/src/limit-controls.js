// The limits: the values shown as black and as full brightness. Always field-wide; they can be given as values, as
// the central share of the band's pixels, as distances from the median in noise sigmas, or taken from the pixels
// on screen (and then applied to the whole field as values).
import { NumberField } from './number-field.js';
import { DEFAULTS } from './display-query.js';

/** Central shares of the pixels (per cent) offered as one-click choices; 99 % is the server's own default. */
export const SHARES = Object.freeze([99, 99.5, 99.9, 100]);

function shareBounds(share) {
  const tail = Number(((100 - share) / 2).toPrecision(7));
  return { plo: tail, phi: Number((100 - tail).toPrecision(7)) };
}

function shareOf(plo, phi) {
  return SHARES.find((share) => {
    const bounds = shareBounds(share);
    return bounds.plo === plo && bounds.phi === phi;
  }) ?? null;
}

const none = { limits: null, lo: null, hi: null, plo: null, phi: null, klo: null, khi: null };

/**
 * Fires `change` with the limits' part of the settings in `detail`, and `fit-view` when the limits are to be taken
 * from the pixels on screen.
 */
export class LimitControls extends EventTarget {
  #root;
  #modes;
  #lo;
  #hi;
  #plo;
  #phi;
  #klo;
  #khi;
  #shares;
  #fitButton;
  #current = none;

  constructor(root) {
    super();
    this.#root = root;
    this.#modes = [...root.querySelectorAll('input[name=limit-mode]')];
    this.#lo = new NumberField({ label: 'Low', name: 'lo' });
    this.#hi = new NumberField({ label: 'High', name: 'hi' });
    root.querySelector('[data-role=limit-values]').append(this.#lo.element, this.#hi.element);
    this.#plo = new NumberField({ label: 'From %', name: 'plo', accept: (n) => n >= 0 && n <= 100 });
    this.#phi = new NumberField({ label: 'To %', name: 'phi', accept: (n) => n >= 0 && n <= 100 });
    root.querySelector('[data-role=share-custom]').append(this.#plo.element, this.#phi.element);
    this.#klo = new NumberField({ label: 'σ below', name: 'klo', min: 0, max: 10, accept: (n) => n >= 0 });
    this.#khi = new NumberField({ label: 'σ above', name: 'khi', min: 0.5, max: 500, log: true, accept: (n) => n > 0 });
    root.querySelector('[data-role=limit-robust]').append(this.#klo.element, this.#khi.element);

    const shares = root.querySelector('[data-role=share-presets]');
    this.#shares = [...SHARES.map((share) => [String(share), `${share} %`]), ['custom', 'Other']].map(([value, text]) => {
      const button = document.createElement('button');
      button.type = 'button';
      button.className = 'chip';
      button.dataset.share = value;
      button.textContent = text;
      button.setAttribute('aria-pressed', 'false');
      shares.append(button);
      return button;
    });
    this.#fitButton = root.querySelector('#limits-from-view');

    for (const radio of this.#modes) radio.addEventListener('change', () => this.#pickMode(radio.value));
    this.#lo.addEventListener('value', () => this.#emitValues());
    this.#hi.addEventListener('value', () => this.#emitValues());
    this.#plo.addEventListener('value', (e) => this.#emit({ ...none, limits: 'percentile', plo: e.detail, phi: this.#phi.value ?? DEFAULTS.phi }));
    this.#phi.addEventListener('value', (e) => this.#emit({ ...none, limits: 'percentile', plo: this.#plo.value ?? DEFAULTS.plo, phi: e.detail }));
    this.#klo.addEventListener('value', (e) => this.#emit({ ...none, limits: 'robust', klo: e.detail, khi: this.#khi.value ?? DEFAULTS.khi }));
    this.#khi.addEventListener('value', (e) => this.#emit({ ...none, limits: 'robust', klo: this.#klo.value ?? DEFAULTS.klo, khi: e.detail }));
    for (const button of this.#shares) {
      button.addEventListener('click', () => {
        if (button.dataset.share === 'custom') {
          this.#root.querySelector('[data-role=share-custom]').hidden = false;
          this.#plo.element.querySelector('input').focus();
          return;
        }
        this.#emit({ ...none, limits: 'percentile', ...shareBounds(Number(button.dataset.share)) });
      });
    }
    this.#fitButton.addEventListener('click', () => this.dispatchEvent(new CustomEvent('fit-view')));
    this.show(none, null);
  }

  /** Whether limits can be taken from the screen now (an image is shown and the server can be asked). */
  set fitEnabled(enabled) {
    this.#fitButton.disabled = !enabled;
  }

  /** Shows the settings asked for; `resolved` (the server's answer, or null) fills the low and high boxes. */
  show(display, resolved) {
    this.#current = {
      limits: display.limits, lo: display.lo, hi: display.hi, plo: display.plo, phi: display.phi, klo: display.klo, khi: display.khi,
    };
    const mode = display.limits ?? 'auto';
    for (const radio of this.#modes) radio.checked = radio.value === mode;
    this.#root.dataset.mode = mode;
    this.#lo.show(display.lo ?? resolved?.lo ?? null);
    this.#hi.show(display.hi ?? resolved?.hi ?? null);
    const plo = display.plo ?? DEFAULTS.plo;
    const phi = display.phi ?? DEFAULTS.phi;
    this.#plo.show(plo);
    this.#phi.show(phi);
    const share = mode === 'percentile' ? shareOf(plo, phi) : null;
    for (const button of this.#shares) {
      const pressed = mode === 'percentile' && (button.dataset.share === 'custom' ? share === null : Number(button.dataset.share) === share);
      button.setAttribute('aria-pressed', String(pressed));
    }
    const custom = this.#root.querySelector('[data-role=share-custom]');
    if (mode === 'percentile' && share === null) custom.hidden = false;
    else if (!custom.contains(document.activeElement)) custom.hidden = true;
    this.#klo.show(display.klo ?? DEFAULTS.klo);
    this.#khi.show(display.khi ?? DEFAULTS.khi);
  }

  #pickMode(mode) {
    if (mode === 'auto') this.#emit(none);
    else if (mode === 'value') this.#emitValues();
    else if (mode === 'percentile') this.#emit({ ...none, limits: mode, plo: this.#plo.value ?? DEFAULTS.plo, phi: this.#phi.value ?? DEFAULTS.phi });
    else this.#emit({ ...none, limits: mode, klo: this.#klo.value ?? DEFAULTS.klo, khi: this.#khi.value ?? DEFAULTS.khi });
  }

  // The boxes hold the limits in use whatever the mode, so switching to values keeps the picture as it is.
  #emitValues() {
    const lo = this.#lo.value;
    const hi = this.#hi.value;
    if (lo === null || hi === null || !(lo < hi)) {
      this.#root.querySelector('[data-role=limit-values]').dataset.invalid = 'true';
      return;
    }
    delete this.#root.querySelector('[data-role=limit-values]').dataset.invalid;
    this.#emit({ ...none, limits: 'value', lo, hi });
  }

  #emit(limits) {
    this.dispatchEvent(new CustomEvent('change', { detail: limits }));
  }
}
