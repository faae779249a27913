// The colour bar: the colours of the display from the low to the high limit, with ticks at physical values (in the
// band's BUNIT). Ticks sit at even steps of brightness rather than of value, so that a log or asinh curve still gets
// ticks across the whole bar; each inner tick is rounded to a short number and drawn where that number falls.
import { paintStrip } from './colour-strip.js';
import { formatPixelValue } from './value-format.js';

const INNER_TICKS = [1 / 3, 2 / 3];
// Labels closer than this share of the bar would run into each other.
const MIN_GAP = 0.22;
// End labels to 5 significant digits: enough to tell the limits apart, short enough to fit beside a tick.
const END_DIGITS = 5;

/** t in [0, 1] where `value` falls on a bar whose colour i shows values[i] (values nondecreasing). */
export function positionOf(values, value) {
  const last = values.length - 1;
  if (value <= values[0]) return 0;
  if (value >= values[last]) return 1;
  let low = 0;
  let high = last;
  while (high - low > 1) {
    const mid = (low + high) >> 1;
    if (values[mid] <= value) low = mid;
    else high = mid;
  }
  const span = values[high] - values[low];
  const within = span > 0 ? (value - values[low]) / span : 0;
  return (low + within) / last;
}

function valueAt(values, t) {
  const at = t * (values.length - 1);
  const low = Math.floor(at);
  const high = Math.min(values.length - 1, low + 1);
  return values[low] + (at - low) * (values[high] - values[low]);
}

function roundedTick(values, t) {
  const value = valueAt(values, t);
  const spread = Math.abs(valueAt(values, Math.min(1, t + 0.1)) - valueAt(values, Math.max(0, t - 0.1)));
  if (!(spread > 0)) return value;
  const step = 10 ** Math.floor(Math.log10(spread / 2));
  return Number((Math.round(value / step) * step).toPrecision(6));
}

/** The ticks of a colour bar: [{value, t, text}], the two limits first and last. */
export function colourBarTicks(values) {
  const lo = values[0];
  const hi = values[values.length - 1];
  const ticks = [{ value: lo, t: 0 }];
  for (const target of INNER_TICKS) {
    const value = roundedTick(values, target);
    const t = positionOf(values, value);
    const previous = ticks[ticks.length - 1];
    // A tick crowding its neighbour (a flat stretch of the curve) is left out.
    if (value > previous.value && value < hi && t - previous.t > MIN_GAP && 1 - t > MIN_GAP) ticks.push({ value, t });
  }
  ticks.push({ value: hi, t: 1 });
  const last = ticks.length - 1;
  return ticks.map((tick, i) => ({
    ...tick,
    text: formatPixelValue(i === 0 || i === last ? Number(tick.value.toPrecision(END_DIGITS)) : tick.value),
  }));
}

export class ColourBar {
  #root;
  #canvas;
  #ticks;
  #unit;

  constructor(root) {
    this.#root = root;
    this.#canvas = root.querySelector('canvas');
    this.#ticks = root.querySelector('[data-role=colour-bar-ticks]');
    this.#unit = root.querySelector('[data-role=colour-bar-unit]');
  }

  /** Draws the colour bar of a resolved display (the /display answer). */
  show(resolved) {
    const { values, colors } = resolved.colorbar;
    paintStrip(this.#canvas, colors);
    this.#ticks.replaceChildren(...colourBarTicks(values).map((tick) => {
      const mark = document.createElement('span');
      mark.className = 'colour-bar-tick';
      mark.style.left = `${tick.t * 100}%`;
      mark.dataset.value = String(tick.value);
      mark.dataset.t = String(tick.t);
      mark.textContent = tick.text;
      return mark;
    }));
    this.#unit.textContent = resolved.bunit ? resolved.bunit : 'no unit given (no BUNIT)';
    this.#unit.dataset.bunit = resolved.bunit ?? '';
    this.#root.dataset.key = resolved.key ?? '';
    this.#root.dataset.ready = 'true';
  }

  clear() {
    delete this.#root.dataset.ready;
    this.#ticks.replaceChildren();
    paintStrip(this.#canvas, []);
  }
}
