// The server's HTTP API. Paths are relative to the page so the app also works behind a proxy under a sub-path.
import { ApiError } from './api-error.js';
import { takeStarted } from './boot.js';
import { displayParameters } from './display-query.js';
import { colourParameters } from './colour-query.js';

// Display parameters a composite does not take: palettes are refused with rgb (colour contract).
const PALETTE_PARAMETERS = new Set(['palette', 'ch-start', 'ch-rot', 'ch-hue', 'ch-gamma']);

// A channel that names its own limits mode (or tone curve) must not inherit the shared mode's parameters, which
// the server refuses beside another mode: they are overridden with empty values for that channel.
const GROUPS = Object.freeze([
  ['limits', ['limits', 'lo', 'hi', 'plo', 'phi', 'klo', 'khi']],
  ['stretch', ['stretch', 'gamma', 'a', 'soft', 'pivot']],
]);

function blankSharedGroups(query, shared, colour) {
  const sharedNames = new Set(shared.map(([name]) => name));
  for (const channel of ['red', 'green', 'blue']) {
    const own = colour.channels[channel];
    for (const [selector, members] of GROUPS) {
      if (own[selector] === undefined) continue;
      for (const name of members) {
        if (sharedNames.has(name) && own[name] === undefined) query.set(`${channel}-${name}`, '');
      }
    }
  }
}

function compositeQuery(hdu, display, colour, masked) {
  const query = new URLSearchParams(colourParameters(colour));
  if (hdu !== null) query.set('hdu', String(hdu));
  // Lupton's composite has its own tone curve; the per-band one shares the display settings between channels.
  if (colour.rgb === 'each') {
    const shared = displayParameters(display, { masked: null }).filter(([name]) => !PALETTE_PARAMETERS.has(name));
    for (const [name, value] of shared) query.set(name, value);
    blankSharedGroups(query, shared, colour);
  }
  if (masked !== null) query.set('masked', masked);
  return query;
}

// The answer boot.js asked for early is used where the caller cannot cancel, else (or if it failed) a new request.
async function getJson(path, signal) {
  const early = signal === undefined ? takeStarted(path) : null;
  const answer = early === null ? null : await early.catch(() => null);
  if (answer !== null && answer.response.ok) return answer.body;
  const response = answer?.response ?? await fetch(path, { signal, headers: { Accept: 'application/json' } });
  if (!response.ok) throw await ApiError.fromResponse(response);
  return response.json();
}

/** Every field the server has, readable or not (an unreadable one carries `error`). */
export function listFields(signal) {
  return getJson('api/fields', signal);
}

/** One field, with the current pyramid state of each HDU. */
export function getField(fieldId, signal) {
  return getJson(`api/fields/${encodeURIComponent(fieldId)}`, signal);
}

/** The pixel containing FITS position (x, y) — 1-based, fractional allowed — and its value (null where masked). */
export function probePixel({ field, band, hdu }, x, y, signal) {
  const query = new URLSearchParams({ band, hdu: String(hdu), x: String(x), y: String(y) });
  return getJson(`api/fields/${encodeURIComponent(field)}/probe?${query}`, signal);
}

/**
 * Where ICRS position (ra, dec) in degrees falls on one HDU: the answer's `atX`/`atY`, or on the whole field
 * (`hdu: 'canvas'`) its `canvas` {x, y}. 404 when the position is off that HDU.
 */
export function probeSky({ field, band, hdu }, ra, dec, signal) {
  const query = new URLSearchParams({ band, hdu: String(hdu), ra: String(ra), dec: String(dec) });
  return getJson(`api/fields/${encodeURIComponent(field)}/probe?${query}`, signal);
}

/**
 * The pixel at a sky position typed by a person (sexagesimal or decimal degrees, ICRS), on whichever HDU of the band
 * holds it: the answer's `hdu` says which, `atX`/`atY` where on it. With `hdu: 'canvas'` it is looked up on the
 * band's whole field, and the answer's `canvas` ({x, y}) says where the position is on that.
 */
export function probePosition({ field, band, hdu = null }, position, signal) {
  const query = new URLSearchParams({ band, position });
  if (hdu !== null) query.set('hdu', String(hdu));
  return getJson(`api/fields/${encodeURIComponent(field)}/probe?${query}`, signal);
}

/**
 * What a coordinate grid, compass and scale bar need for box [x0, x1] x [y0, y1] (FITS, 1-based, fractional)
 * drawn on `width` x `height` screen pixels: the centre's sky position, north and east, pixel scale, grid lines.
 */
export function getSky({ field, band, hdu }, { x0, y0, x1, y1, width, height }, signal) {
  const query = new URLSearchParams({ band, hdu: String(hdu) });
  for (const [name, value] of Object.entries({ x0, y0, x1, y1, width, height })) query.set(name, String(value));
  return getJson(fieldPath(field, 'sky', query), signal);
}

/**
 * A Leaflet URL template for the tiles of one HDU with the given display settings. Masked pixels stay transparent
 * in tiles: the page paints its own masked colour under them, so changing that colour fetches nothing.
 */
export function tileUrlTemplate({ field, band, hdu }, display = null) {
  const query = new URLSearchParams({ band, hdu: String(hdu) });
  if (display !== null) {
    for (const [name, value] of displayParameters(display, { masked: 'transparent' })) query.set(name, value);
  }
  return `tiles/${encodeURIComponent(field)}/{z}/{x}/{y}.png?${query}`;
}

/**
 * The tile URL template of a colour composite of one HDU (`colour.rgb` set, all three bands named), masked pixels
 * (masked in any band) transparent as in single-band tiles.
 */
export function compositeTileUrlTemplate({ field, hdu }, display, colour) {
  const query = compositeQuery(hdu, display, colour, 'transparent');
  return `tiles/${encodeURIComponent(field)}/{z}/{x}/{y}.png?${query}`;
}

/** The composite resolved against its bands' statistics: Q, range and minima, or each channel's limits. */
export function getCompositeDisplay({ field, hdu }, display, colour, signal) {
  return getJson(fieldPath(field, 'display', compositeQuery(hdu, display, colour, null)), signal);
}

function fieldPath(field, endpoint, query) {
  return `api/fields/${encodeURIComponent(field)}/${endpoint}?${query}`;
}

/** The display resolved for a band: limits, stretch and palette parameters as numbers, and the colour bar. */
export function getDisplay({ field, band }, display, signal) {
  const query = new URLSearchParams({ band });
  for (const [name, value] of displayParameters(display, { masked: null })) query.set(name, value);
  return getJson(fieldPath(field, 'display', query), signal);
}

/** Counts of the band's finite pixels, field-wide, in `bins` equal bins over [lo, hi]. */
export function getHistogram({ field, band }, { lo, hi, bins }, signal) {
  const query = new URLSearchParams({ band, bins: String(bins), lo: String(lo), hi: String(hi) });
  return getJson(fieldPath(field, 'histogram', query), signal);
}

/** The band's field-wide statistics. */
export function getBandStats({ field, band }, signal) {
  return getJson(fieldPath(field, 'stats', new URLSearchParams({ band })), signal);
}

/** Statistics of the pixels in box [x0, x1] x [y0, y1] (FITS, 1-based, inclusive) of one HDU. */
export function getBoxStats({ field, band, hdu }, { x0, y0, x1, y1 }, signal) {
  const query = new URLSearchParams({ band, hdu: String(hdu), x0: String(x0), y0: String(y0), x1: String(x1), y1: String(y1) });
  return getJson(fieldPath(field, 'stats', query), signal);
}

/** Every palette the server draws with, each with its 256 colours. */
export function listPalettes(signal) {
  return getJson('api/palettes', signal);
}

/**
 * The FITS cutout of pixel box {x0, y0, x1, y1} (FITS 1-based, inclusive) of a chip or of the whole-field canvas, as
 * a Blob: original values and data type, with its WCS (the canvas: resampled values).
 */
export async function getCutout({ field, band, hdu }, { x0, y0, x1, y1 }, signal) {
  const query = new URLSearchParams({ band, hdu: String(hdu) });
  for (const [name, value] of Object.entries({ x0, y0, x1, y1 })) query.set(name, String(value));
  const response = await fetch(fieldPath(field, 'cutout.fits', query), { signal });
  if (!response.ok) throw await ApiError.fromResponse(response);
  return response.blob();
}
