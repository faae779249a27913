// The display settings as the server's tile, render and display endpoints take them (query parameters named by the
// display contract), normalised so that equal settings always give the same text: only the parameters the chosen
// stretch, limits and palette use are kept, in a fixed order, numbers to 7 significant digits.

export const STRETCHES = Object.freeze(['linear', 'sqrt', 'power', 'log', 'asinh', 'histeq']);
export const LIMIT_MODES = Object.freeze(['auto', 'value', 'percentile', 'robust']);
export const CUBEHELIX = 'cubehelix';

/** The server's defaults (display contract), for boxes that show a value before one is chosen. */
export const DEFAULTS = Object.freeze({
  gamma: 2, a: 1000, plo: 0.5, phi: 99.5, klo: 2, khi: 20, chStart: 0.5, chRot: -1.5, chHue: 1, chGamma: 1,
});

// JS property -> query parameter name, in the order the query is written.
const NAMES = Object.freeze({
  limits: 'limits', lo: 'lo', hi: 'hi', plo: 'plo', phi: 'phi', klo: 'klo', khi: 'khi',
  stretch: 'stretch', gamma: 'gamma', a: 'a', soft: 'soft', pivot: 'pivot',
  palette: 'palette', chStart: 'ch-start', chRot: 'ch-rot', chHue: 'ch-hue', chGamma: 'ch-gamma',
  masked: 'masked',
});

export const EMPTY_DISPLAY = Object.freeze(Object.fromEntries(Object.keys(NAMES).map((key) => [key, null])));

const PALETTE_NAME = /^[a-z0-9][a-z0-9-]{0,39}$/;
const COLOUR = /^[0-9a-f]{6}$/;

// float32 data carries about 7 significant digits (common practice); more would only lengthen links.
export function roundNumber(value) {
  return Number(value.toPrecision(7));
}

function number(value, accept) {
  const n = typeof value === 'string' ? (value.trim() === '' ? NaN : Number(value)) : value;
  return typeof n === 'number' && Number.isFinite(n) && accept(n) ? roundNumber(n) : null;
}

const positive = (n) => n > 0;
const any = () => true;
const within = (low, high) => (n) => n >= low && n <= high;

function pivotOf(value) {
  if (value === 'lo' || value === 'median') return value;
  return number(value, any);
}

function inferLimits(raw) {
  if (LIMIT_MODES.includes(raw.limits)) return raw.limits;
  if (raw.lo != null || raw.hi != null) return 'value';
  if (raw.plo != null || raw.phi != null) return 'percentile';
  if (raw.klo != null || raw.khi != null) return 'robust';
  return 'auto';
}

function limitsOf(raw) {
  const mode = inferLimits(raw);
  const none = { limits: null, lo: null, hi: null, plo: null, phi: null, klo: null, khi: null };
  if (mode === 'value') {
    const lo = number(raw.lo, any);
    const hi = number(raw.hi, any);
    return lo !== null && hi !== null && lo < hi ? { ...none, limits: mode, lo, hi } : none;
  }
  if (mode === 'percentile') {
    const plo = number(raw.plo ?? DEFAULTS.plo, within(0, 100));
    const phi = number(raw.phi ?? DEFAULTS.phi, within(0, 100));
    return plo !== null && phi !== null && plo < phi ? { ...none, limits: mode, plo, phi } : none;
  }
  if (mode === 'robust') {
    const klo = number(raw.klo ?? DEFAULTS.klo, (n) => n >= 0);
    const khi = number(raw.khi ?? DEFAULTS.khi, positive);
    return klo !== null && khi !== null ? { ...none, limits: mode, klo, khi } : none;
  }
  return none;
}

function stretchOf(raw) {
  const stretch = STRETCHES.includes(raw.stretch) ? raw.stretch : null;
  return {
    stretch,
    gamma: stretch === 'power' ? number(raw.gamma, positive) : null,
    a: stretch === 'log' ? number(raw.a, positive) : null,
    soft: stretch === 'asinh' ? number(raw.soft, positive) : null,
    pivot: stretch === 'asinh' ? pivotOf(raw.pivot) : null,
  };
}

function paletteOf(raw) {
  const palette = typeof raw.palette === 'string' && PALETTE_NAME.test(raw.palette) ? raw.palette : null;
  const cube = palette === CUBEHELIX;
  return {
    palette,
    chStart: cube ? number(raw.chStart, within(0, 3)) : null,
    chRot: cube ? number(raw.chRot, within(-10, 10)) : null,
    chHue: cube ? number(raw.chHue, within(0, 3)) : null,
    chGamma: cube ? number(raw.chGamma, (n) => n > 0 && n <= 10) : null,
  };
}

function maskedOf(value) {
  const text = typeof value === 'string' ? value.trim().replace(/^#/, '').toLowerCase() : '';
  return COLOUR.test(text) ? text : null;
}

/** Settings with every unusable or unused value dropped (null: the server's default). */
export function normaliseDisplay(raw = {}) {
  return Object.freeze({ ...limitsOf(raw), ...stretchOf(raw), ...paletteOf(raw), masked: maskedOf(raw.masked) });
}

/** Reads the display settings out of a page or tile query. */
export function parseDisplayQuery(search) {
  const query = search instanceof URLSearchParams ? search : new URLSearchParams(search);
  const raw = {};
  for (const [key, name] of Object.entries(NAMES)) {
    const value = query.get(name);
    if (value !== null && value.trim() !== '') raw[key] = value.trim();
  }
  return normaliseDisplay(raw);
}

/** [name, value] pairs of the settings, in the fixed order; `masked` replaces the page's masked colour. */
export function displayParameters(display, { masked = display.masked } = {}) {
  const pairs = [];
  for (const [key, name] of Object.entries(NAMES)) {
    const value = key === 'masked' ? masked : display[key];
    if (value !== null && value !== undefined) pairs.push([name, String(value)]);
  }
  return pairs;
}

export function sameDisplay(a, b) {
  return Object.keys(NAMES).every((key) => a[key] === b[key]);
}

/** Names of the display parameters in `search` that `display` (its normalised form) left out: unused or unusable. */
export function droppedParameters(search, display) {
  const query = new URLSearchParams(search);
  const kept = new Set(displayParameters(display).map(([name]) => name));
  return Object.values(NAMES).filter((name) => query.has(name) && !kept.has(name));
}
