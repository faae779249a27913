// The colour-composite settings as the tile and display endpoints take them: `rgb` (lupton or each), the bands of
// `red`, `green` and `blue`, Lupton's `q`, `range` and `min`, the channel weights `scale`, and for per-band
// composites the display parameters of one channel, prefixed `red-`, `green-` or `blue-`. Normalised like the
// display settings (display-query.js): only what the mode uses, in a fixed order, numbers to 7 significant digits.
import { STRETCHES, LIMIT_MODES, roundNumber } from './display-query.js';

export const MODES = Object.freeze(['lupton', 'each']);
export const CHANNELS = Object.freeze(['red', 'green', 'blue']);

/** Defaults the server documents for Lupton composites (colour contract), shown before it has answered. */
export const LUPTON_DEFAULTS = Object.freeze({ q: 8 });

// Per-channel display parameters (query name after the prefix) and how each is read; palettes do not apply.
const CHANNEL_PARAMETERS = Object.freeze({
  limits: (v) => (LIMIT_MODES.includes(v) ? v : null),
  lo: (v) => number(v, any),
  hi: (v) => number(v, any),
  plo: (v) => number(v, (n) => n >= 0 && n <= 100),
  phi: (v) => number(v, (n) => n >= 0 && n <= 100),
  klo: (v) => number(v, (n) => n >= 0),
  khi: (v) => number(v, positive),
  stretch: (v) => (STRETCHES.includes(v) ? v : null),
  gamma: (v) => number(v, positive),
  a: (v) => number(v, positive),
  soft: (v) => number(v, positive),
  pivot: (v) => (v === 'lo' || v === 'median' ? v : number(v, any)),
});
export const CHANNEL_PARAMETER_NAMES = Object.freeze(Object.keys(CHANNEL_PARAMETERS));

const BAND_NAME = /^[^\s,&=?#]{1,64}$/;

const positive = (n) => n > 0;
const any = () => true;

function number(value, accept) {
  const n = typeof value === 'string' ? (value.trim() === '' ? NaN : Number(value)) : value;
  return typeof n === 'number' && Number.isFinite(n) && accept(n) ? roundNumber(n) : null;
}

function numberList(value, lengths, accept) {
  const items = Array.isArray(value) ? value : typeof value === 'string' ? value.split(',') : null;
  if (items === null || !lengths.includes(items.length)) return null;
  const numbers = items.map((item) => number(item, accept));
  return numbers.every((n) => n !== null) ? Object.freeze(numbers) : null;
}

function bandOf(value) {
  return typeof value === 'string' && BAND_NAME.test(value.trim()) ? value.trim() : null;
}

function overridesOf(raw) {
  const result = {};
  for (const channel of CHANNELS) {
    const own = {};
    for (const [name, read] of Object.entries(CHANNEL_PARAMETERS)) {
      const value = raw?.[channel]?.[name];
      const parsed = value === null || value === undefined ? null : read(typeof value === 'string' ? value.trim() : value);
      if (parsed !== null) own[name] = parsed;
    }
    // Value limits need both ends, and are meant as values whatever the shared limits are.
    if ((own.lo !== undefined) !== (own.hi !== undefined) || (own.lo !== undefined && !(own.lo < own.hi))) {
      delete own.lo;
      delete own.hi;
    }
    if (own.lo !== undefined) own.limits = 'value';
    result[channel] = Object.freeze(own);
  }
  return Object.freeze(result);
}

const NO_OVERRIDES = overridesOf({});

export const EMPTY_COLOUR = Object.freeze({
  rgb: null, red: null, green: null, blue: null, q: null, range: null, min: null, scale: null, channels: NO_OVERRIDES,
});

/** Settings with every unusable or unused value dropped (null: the server's default). */
export function normaliseColour(raw = {}) {
  const rgb = MODES.includes(raw.rgb) ? raw.rgb : null;
  const bands = { red: bandOf(raw.red), green: bandOf(raw.green), blue: bandOf(raw.blue) };
  if (rgb === null) return Object.freeze({ ...EMPTY_COLOUR, ...bands });
  const lupton = rgb === 'lupton';
  let min = lupton ? numberList(raw.min, [1, 3], any) : null;
  if (min?.length === 3 && min[0] === min[1] && min[1] === min[2]) min = Object.freeze([min[0]]);
  let scale = numberList(raw.scale, [3], positive);
  if (scale !== null && scale.every((w) => w === 1)) scale = null;
  return Object.freeze({
    rgb,
    ...bands,
    q: lupton ? number(raw.q, positive) : null,
    range: lupton ? number(raw.range, positive) : null,
    min,
    scale,
    channels: lupton ? NO_OVERRIDES : overridesOf(raw.channels),
  });
}

/** Reads the colour settings out of a page or tile query. */
export function parseColourQuery(search) {
  const query = search instanceof URLSearchParams ? search : new URLSearchParams(search);
  const text = (name) => {
    const value = query.get(name);
    return value === null || value.trim() === '' ? null : value.trim();
  };
  const channels = {};
  for (const channel of CHANNELS) {
    channels[channel] = {};
    for (const name of CHANNEL_PARAMETER_NAMES) channels[channel][name] = text(`${channel}-${name}`);
  }
  return normaliseColour({
    rgb: text('rgb')?.toLowerCase(), red: text('red'), green: text('green'), blue: text('blue'),
    q: text('q'), range: text('range'), min: text('min'), scale: text('scale'), channels,
  });
}

/**
 * [name, value] pairs, in a fixed order: `rgb` and the bands, Lupton's parameters, weights, then each channel's own
 * display parameters. Without a mode only the band assignment is written (it also chooses the side-by-side panes).
 */
export function colourParameters(colour, { bands = true } = {}) {
  const pairs = [];
  if (colour.rgb !== null) pairs.push(['rgb', colour.rgb]);
  if (bands || colour.rgb !== null) {
    for (const channel of CHANNELS) if (colour[channel] !== null) pairs.push([channel, colour[channel]]);
  }
  if (colour.rgb === null) return pairs;
  if (colour.q !== null) pairs.push(['q', String(colour.q)]);
  if (colour.range !== null) pairs.push(['range', String(colour.range)]);
  if (colour.min !== null) pairs.push(['min', colour.min.join(',')]);
  if (colour.scale !== null) pairs.push(['scale', colour.scale.join(',')]);
  for (const channel of CHANNELS) {
    const own = colour.channels[channel];
    for (const name of CHANNEL_PARAMETER_NAMES) {
      if (own[name] !== undefined) pairs.push([`${channel}-${name}`, String(own[name])]);
    }
  }
  return pairs;
}

export function sameColour(a, b) {
  const text = (colour) => new URLSearchParams(colourParameters(colour)).toString();
  return text(a) === text(b);
}

/** The three band names, each channel's own or the default's. */
export function channelBands(colour, defaults) {
  return { red: colour.red ?? defaults.red, green: colour.green ?? defaults.green, blue: colour.blue ?? defaults.blue };
}
