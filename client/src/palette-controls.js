// The palette (brightness to colour), the cubehelix parameters when that palette is chosen, and the colour the page
// paints masked pixels in (never part of a tile: tiles leave masked pixels transparent).
import { NumberField } from './number-field.js';
import { CUBEHELIX, DEFAULTS } from './display-query.js';
import { paintStrip } from './colour-strip.js';

// What the server draws when no palette is named (display contract).
const DEFAULT_PALETTE = 'gray';

const CUBEHELIX_FIELDS = Object.freeze([
  { key: 'chStart', label: 'Start hue', name: 'ch-start', min: 0, max: 3, accept: (n) => n >= 0 && n <= 3 },
  { key: 'chRot', label: 'Turns', name: 'ch-rot', min: -10, max: 10, accept: (n) => n >= -10 && n <= 10 },
  { key: 'chHue', label: 'Saturation', name: 'ch-hue', min: 0, max: 3, accept: (n) => n >= 0 && n <= 3 },
  { key: 'chGamma', label: 'Gamma', name: 'ch-gamma', min: 0.1, max: 10, log: true, accept: (n) => n > 0 && n <= 10 },
]);

/**
 * Fires `change` with the palette's part of the settings ({palette, chStart, chRot, chHue, chGamma}) and `masked`
 * with the chosen masked colour ("rrggbb", or null for the page's own) in `detail`.
 */
export class PaletteControls extends EventTarget {
  #list;
  #note;
  #cubehelix;
  #fields;
  #maskInput;
  #maskReset;
  #defaultMask;
  #previews = new Map();
  #current = { palette: null, chStart: null, chRot: null, chHue: null, chGamma: null };

  constructor(root, defaultMask) {
    super();
    this.#list = root.querySelector('[data-role=palette-list]');
    this.#note = root.querySelector('[data-role=palette-note]');
    this.#cubehelix = root.querySelector('[data-role=cubehelix]');
    this.#fields = CUBEHELIX_FIELDS.map((spec) => {
      const field = new NumberField(spec);
      field.addEventListener('value', (e) => this.#emit({ [spec.key]: e.detail }));
      this.#cubehelix.append(field.element);
      return { spec, field };
    });
    this.#defaultMask = defaultMask;
    this.#maskInput = root.querySelector('#mask-colour');
    this.#maskReset = root.querySelector('#mask-colour-reset');
    this.#maskInput.value = `#${defaultMask}`;
    this.#maskInput.addEventListener('input', () => this.#emitMask(this.#maskInput.value.slice(1).toLowerCase()));
    this.#maskReset.addEventListener('click', () => this.#emitMask(null));
  }

  /** The palettes the server offers: [{name, label, colors}]. */
  setPalettes(palettes) {
    this.#note.hidden = true;
    this.#previews.clear();
    this.#list.replaceChildren(...palettes.map((palette) => {
      const item = document.createElement('label');
      item.className = 'palette-choice';
      const radio = document.createElement('input');
      radio.type = 'radio';
      radio.name = 'palette';
      radio.value = palette.name;
      radio.addEventListener('change', () => {
        if (radio.checked) this.#emit({ palette: palette.name });
      });
      const canvas = document.createElement('canvas');
      canvas.className = 'palette-preview';
      canvas.width = 256;
      canvas.height = 12;
      canvas.setAttribute('aria-hidden', 'true');
      paintStrip(canvas, palette.colors);
      this.#previews.set(palette.name, canvas);
      const name = document.createElement('span');
      name.className = 'palette-name';
      name.textContent = palette.label ?? palette.name;
      item.append(radio, name, canvas);
      return item;
    }));
    this.show(this.#current);
  }

  /** The palettes could not be listed: say so where they would be. */
  showUnavailable(text) {
    this.#note.textContent = text;
    this.#note.hidden = false;
  }

  /** Redraws the preview of the palette in use with the colours the server resolved (cubehelix as tuned). */
  showResolvedColours(name, colors) {
    const canvas = this.#previews.get(name);
    if (canvas && colors?.length) paintStrip(canvas, colors);
  }

  show(display) {
    this.#current = {
      palette: display.palette, chStart: display.chStart, chRot: display.chRot, chHue: display.chHue, chGamma: display.chGamma,
    };
    const palette = display.palette ?? DEFAULT_PALETTE;
    for (const radio of this.#list.querySelectorAll('input[name=palette]')) radio.checked = radio.value === palette;
    this.#cubehelix.hidden = palette !== CUBEHELIX;
    for (const { spec, field } of this.#fields) field.show(display[spec.key] ?? DEFAULTS[spec.key]);
  }

  /** The colour masked pixels take while none is chosen: the current palette's own. */
  setDefaultMask(hex) {
    this.#defaultMask = hex;
    if (this.#maskReset.disabled && document.activeElement !== this.#maskInput) this.#maskInput.value = `#${hex}`;
  }

  showMask(masked) {
    const hex = masked ?? this.#defaultMask;
    if (document.activeElement !== this.#maskInput) this.#maskInput.value = `#${hex}`;
    this.#maskReset.disabled = masked === null;
  }

  #emit(change) {
    this.dispatchEvent(new CustomEvent('change', { detail: { ...this.#current, ...change } }));
  }

  #emitMask(hex) {
    this.dispatchEvent(new CustomEvent('masked', { detail: hex === this.#defaultMask ? null : hex }));
  }
}
