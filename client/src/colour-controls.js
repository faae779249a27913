// The colour section of the display panel: one band, or a colour composite of three — Lupton et al. (2004)'s
// asinh composite, which keeps each pixel's colour however bright it is, or each band on its own tone curve — with
// the band of each channel, Lupton's softening Q and linear range, and each channel's minimum or limits and weight.
import { NumberField } from './number-field.js';
import { ChannelRow } from './channel-row.js';
import { CHANNELS, LUPTON_DEFAULTS, normaliseColour } from './colour-query.js';

const positive = (n) => n > 0;

// How many times smaller or larger than the resolved range the range slider reaches.
const RANGE_SPAN = 30;

function numberTriple(value) {
  return Array.isArray(value) && value.length === 3 && value.every((n) => typeof n === 'number') ? value : null;
}

/**
 * The server's resolved composite (GET /api/fields/{field}/display?rgb=…: {key, mode, scale, lupton: {q, range,
 * min}, channels: {red, green, blue: resolved display}}) as the controls use it; null where a part is missing.
 */
export function readResolvedColour(dto) {
  if (!dto || typeof dto !== 'object') return null;
  const lupton = dto.lupton ?? {};
  return {
    key: typeof dto.key === 'string' ? dto.key : null,
    q: typeof lupton.q === 'number' ? lupton.q : null,
    range: typeof lupton.range === 'number' ? lupton.range : null,
    min: numberTriple(lupton.min),
    scale: numberTriple(dto.scale),
    limits: CHANNELS.map((channel) => {
      const c = dto.channels?.[channel];
      return typeof c?.lo === 'number' && typeof c?.hi === 'number' ? { lo: c.lo, hi: c.hi } : null;
    }),
  };
}

/** Fires `change` with the new colour settings (normalised) in `detail`. */
export class ColourControls extends EventTarget {
  #root;
  #modes;
  #rows;
  #q;
  #range;
  #swap;
  #summary;
  #colour = normaliseColour({});
  #channels = { red: null, green: null, blue: null };
  #resolved = null;

  constructor(root) {
    super();
    this.#root = root;
    this.#modes = [...root.querySelectorAll('input[name=colour-mode]')];
    const list = root.querySelector('[data-role=channels]');
    this.#rows = Object.fromEntries(CHANNELS.map((channel) => {
      const row = new ChannelRow(channel);
      row.addEventListener('change', (e) => this.#channelChanged(channel, e.detail));
      list.append(row.element);
      return [channel, row];
    }));
    this.#q = new NumberField({
      label: 'Softening Q', name: 'q', min: 0.1, max: 100, log: true, accept: positive,
      title: 'Small Q: nearly linear; large Q: the bright parts compressed more (asinh)',
    });
    this.#range = new NumberField({
      label: 'Linear range', name: 'range', min: 1e-3, max: 1e6, log: true, accept: positive,
      title: 'The brightness, above the minima, over which the curve stays close to linear',
    });
    root.querySelector('[data-role=lupton-fields]').append(this.#q.element, this.#range.element);
    this.#swap = root.querySelector('[data-role=swap-red-blue]');
    this.#summary = root.querySelector('[data-role=colour-summary]');

    for (const radio of this.#modes) {
      radio.addEventListener('change', () => {
        if (radio.checked) this.#emit({ rgb: radio.value === 'single' ? null : radio.value, ...this.#channels });
      });
    }
    this.#q.addEventListener('value', (e) => this.#emit({ q: e.detail }));
    this.#range.addEventListener('value', (e) => this.#emit({ range: e.detail }));
    this.#swap.addEventListener('click', () => this.#emit({ ...this.#channels, red: this.#channels.blue, blue: this.#channels.red }));
  }

  /** The field's readable bands, in listing order. */
  setBands(names) {
    for (const channel of CHANNELS) this.#rows[channel].setBands(names, this.#channels[channel]);
  }

  /**
   * Shows `colour` (the settings asked for), `channels` (the band of each channel, defaults filled in) and
   * `resolved` (the server's answer for them, see readResolvedColour, or null).
   */
  show(colour, channels, resolved = null) {
    this.#colour = colour;
    this.#channels = channels;
    this.#resolved = resolved;
    const mode = colour.rgb ?? 'single';
    for (const radio of this.#modes) radio.checked = radio.value === mode;
    this.#root.dataset.mode = mode;
    CHANNELS.forEach((channel, i) => {
      const own = colour.channels[channel];
      this.#rows[channel].show(mode, {
        band: channels[channel],
        weight: colour.scale?.[i] ?? resolved?.scale?.[i] ?? 1,
        min: colour.min?.[colour.min.length === 1 ? 0 : i] ?? resolved?.min?.[i] ?? null,
        lo: own.lo ?? resolved?.limits[i]?.lo ?? null,
        hi: own.hi ?? resolved?.limits[i]?.hi ?? null,
        own: own.lo !== undefined,
      });
    });
    this.#q.show(colour.q ?? resolved?.q ?? LUPTON_DEFAULTS.q);
    const range = colour.range ?? resolved?.range ?? null;
    const around = resolved?.range ?? colour.range;
    if (around > 0) this.#range.setRange(around / RANGE_SPAN, around * RANGE_SPAN);
    this.#range.show(range);
    this.#summary.textContent = this.#describe(mode, resolved);
  }

  /** One line on what the server resolved; the boxes above hold the same numbers. */
  #describe(mode, resolved) {
    if (mode === 'single' || resolved === null) return '';
    const f = (n) => (typeof n === 'number' ? Number(n.toPrecision(4)).toString() : '?');
    if (mode === 'lupton') {
      // The sections below it are dimmed: say why once, here.
      return `In use: Q ${f(resolved.q)}, range ${f(resolved.range)}, minima ${(resolved.min ?? []).map(f).join(' / ') || '?'}. `
        + 'This composite has its own curve: the Limits and Tone curve sections do not apply.';
    }
    return `In use: ${CHANNELS.map((c, i) => `${c} ${f(resolved.limits[i]?.lo)}…${f(resolved.limits[i]?.hi)}`).join(', ')}`;
  }

  #channelChanged(channel, part) {
    const index = CHANNELS.indexOf(channel);
    if ('band' in part) {
      this.#emit({ ...this.#channels, [channel]: part.band });
    } else if ('weight' in part) {
      const scale = CHANNELS.map((c, i) => this.#colour.scale?.[i] ?? this.#resolved?.scale?.[i] ?? 1);
      scale[index] = part.weight;
      this.#emit({ scale });
    } else if ('min' in part) {
      // One channel's minimum given: the others keep theirs as they are in use.
      const given = this.#colour.min;
      const min = CHANNELS.map((c, i) => given?.[given.length === 1 ? 0 : i] ?? this.#resolved?.min?.[i] ?? 0);
      min[index] = part.min;
      this.#emit({ min });
    } else if ('lo' in part) {
      const own = { ...this.#colour.channels[channel] };
      if (part.lo === null) {
        delete own.lo;
        delete own.hi;
        delete own.limits;
      } else {
        Object.assign(own, { limits: 'value', lo: part.lo, hi: part.hi });
      }
      this.#emit({ channels: { ...this.#colour.channels, [channel]: own } });
    }
  }

  #emit(change) {
    const next = normaliseColour({ ...this.#colour, ...this.#channels, ...change });
    this.dispatchEvent(new CustomEvent('change', { detail: next }));
  }
}
