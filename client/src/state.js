// The view state lives here and nowhere else: controls read it and ask it to change, and every change is mirrored
// into the page URL so that reloading or sharing the link opens the same view, display settings included. The
// centre stays FITS pixels here; the URL names it by RA/Dec once view-link.js has had it converted (link version 1).
import { EMPTY_DISPLAY, normaliseDisplay, parseDisplayQuery, displayParameters, sameDisplay } from './display-query.js';
import { EMPTY_COLOUR, normaliseColour, parseColourQuery, colourParameters, sameColour } from './colour-query.js';
import { EMPTY_LAYOUT, normaliseLayout, parseLayoutQuery, layoutParameters, sameLayout } from './layout-query.js';
import { WHOLE_FIELD } from './whole-field.js';
import { EMPTY_MARKERS, normaliseMarkers, parseMarkerQuery, markerParameters, sameMarkers } from './marker-query.js';

const EMPTY = Object.freeze({
  field: null, band: null, hdu: null, x: null, y: null, z: null, grid: false, outlines: false,
  display: EMPTY_DISPLAY, colour: EMPTY_COLOUR, layout: EMPTY_LAYOUT, markers: EMPTY_MARKERS,
});
const VIEW_KEYS = Object.freeze(['field', 'band', 'hdu', 'x', 'y', 'z']);
// Overlays shown over the image: in the URL only while on (`grid=1`, `outlines=1`).
const FLAG_KEYS = Object.freeze(['grid', 'outlines']);

// A hundredth of a pixel and of a zoom level is finer than anyone can see, and keeps links short.
const DECIMALS = 2;

/** The link format written: 1 names the centre by RA/Dec where the HDU has a celestial WCS. No `v`: version 0, x/y only. */
export const LINK_VERSION = 1;
// ICRS decimal degrees to 1e-7 degree (0.36 mas): well under a hundredth of any camera pixel.
const SKY_DECIMALS = 7;

function parseText(value) {
  const text = value?.trim();
  return text ? text : null;
}

// An HDU index, or `canvas` (any case) for the whole field.
function parseHdu(value) {
  const text = value?.trim();
  if (text && text.toLowerCase() === WHOLE_FIELD) return WHOLE_FIELD;
  return text && /^\d{1,6}$/.test(text) ? Number(text) : null;
}

function normaliseHdu(hdu) {
  if (hdu === WHOLE_FIELD) return WHOLE_FIELD;
  return Number.isInteger(hdu) && hdu >= 0 ? hdu : null;
}

function parseNumber(value) {
  const text = value?.trim();
  if (!text) return null;
  const number = Number(text);
  return Number.isFinite(number) ? number : null;
}

function round(value) {
  const factor = 10 ** DECIMALS;
  return Math.round(value * factor) / factor;
}

/** A centre coordinate or zoom as the state keeps it, so a view opened from a sky position is where its state says. */
export function roundCentre(value) {
  return round(value);
}

function normalise(state) {
  return Object.freeze({
    field: typeof state.field === 'string' && state.field !== '' ? state.field : null,
    band: typeof state.band === 'string' && state.band !== '' ? state.band : null,
    hdu: normaliseHdu(state.hdu),
    x: Number.isFinite(state.x) ? round(state.x) : null,
    y: Number.isFinite(state.y) ? round(state.y) : null,
    z: Number.isFinite(state.z) ? round(state.z) : null,
    grid: state.grid === true,
    outlines: state.outlines === true,
    display: normaliseDisplay(state.display ?? EMPTY_DISPLAY),
    colour: normaliseColour(state.colour ?? EMPTY_COLOUR),
    layout: normaliseLayout(state.layout ?? EMPTY_LAYOUT),
    markers: normaliseMarkers(state.markers ?? EMPTY_MARKERS),
  });
}

/**
 * Reads a view from a URL query such as `?field=demo&band=red&hdu=3&x=1024.5&y=2048.5&z=3&grid=1&outlines=1&stretch=log&a=300`
 * (`hdu=canvas`: the band's whole field): the display and colour parameters are those of the tile URLs, except
 * that `masked` is the colour the page paints masked pixels in; the layout parameters (layout-query.js) are the
 * page's own.
 */
export function parseViewQuery(search) {
  const query = new URLSearchParams(search);
  return normalise({
    field: parseText(query.get('field')),
    band: parseText(query.get('band')),
    hdu: parseHdu(query.get('hdu')),
    x: parseNumber(query.get('x')),
    y: parseNumber(query.get('y')),
    z: parseNumber(query.get('z')),
    grid: query.get('grid')?.trim() === '1',
    outlines: query.get('outlines')?.trim() === '1',
    display: parseDisplayQuery(query),
    colour: parseColourQuery(query),
    layout: parseLayoutQuery(query),
    markers: parseMarkerQuery(query),
  });
}

/** Whether `sky` ({field, band, hdu, x, y, ra, dec}) is the sky position of the centre of `state`. */
export function isSkyCentreOf(sky, state) {
  return sky !== null && sky !== undefined && state.x !== null && state.y !== null
    && ['field', 'band', 'hdu', 'x', 'y'].every((key) => sky[key] === state[key]);
}

/** RA (wrapped into [0, 360)) and Dec as the link writes them. */
export function formatSky(ra, dec) {
  let raText = (((ra % 360) + 360) % 360).toFixed(SKY_DECIMALS);
  if (Number(raText) >= 360) raText = (0).toFixed(SKY_DECIMALS);
  return { ra: raText, dec: dec.toFixed(SKY_DECIMALS) };
}

/**
 * Writes a view as a URL query in link version 1, in a fixed order so equal views give equal links: the centre
 * as `ra`/`dec` when `sky` is its sky position (see isSkyCentreOf), else as `x`/`y`.
 */
export function formatViewQuery(state, sky = null) {
  const query = new URLSearchParams();
  if (state.field !== null) query.set('v', String(LINK_VERSION));
  const onSky = isSkyCentreOf(sky, state);
  for (const key of VIEW_KEYS) {
    if (onSky && key === 'x') {
      const text = formatSky(sky.ra, sky.dec);
      query.set('ra', text.ra);
      query.set('dec', text.dec);
      continue;
    }
    if (onSky && key === 'y') continue;
    if (state[key] !== null) query.set(key, String(state[key]));
  }
  for (const key of FLAG_KEYS) {
    if (state[key] === true) query.set(key, '1');
  }
  for (const [name, value] of displayParameters(state.display ?? EMPTY_DISPLAY)) query.set(name, value);
  for (const [name, value] of colourParameters(state.colour ?? EMPTY_COLOUR)) query.set(name, value);
  for (const [name, value] of layoutParameters(state.layout ?? EMPTY_LAYOUT)) query.set(name, value);
  for (const [name, value] of markerParameters(state.markers ?? EMPTY_MARKERS)) query.set(name, value);
  const text = query.toString();
  return text ? `?${text}` : '';
}

/**
 * The field, band, HDU, centre (FITS pixels, 1-based), zoom, overlays and display settings being viewed. Fires `change` with the new state in
 * `detail` after every update that changed something.
 */
export class ViewState extends EventTarget {
  #state;
  #history;
  #location;
  #sky = null;

  constructor(initial = EMPTY, { history = window.history, location = window.location } = {}) {
    super();
    this.#state = normalise({ ...EMPTY, ...initial });
    this.#history = history;
    this.#location = location;
  }

  static fromUrl(location = window.location, history = window.history) {
    return new ViewState(parseViewQuery(location.search), { history, location });
  }

  get current() {
    return this.#state;
  }

  /** The sky position of the current centre ({field, band, hdu, x, y, ra, dec}), or null while it is not known. */
  get skyCentre() {
    return isSkyCentreOf(this.#sky, this.#state) ? this.#sky : null;
  }

  /** The centre's sky position as the server gave it (view-link.js asks); the URL names the centre by it while it is current. */
  setSkyCentre(sky) {
    if (!isSkyCentreOf(sky, this.#state)) return;
    const before = this.skyCentre;
    this.#sky = sky;
    if (this.skyCentre !== before) this.#mirrorToUrl();
  }

  /** Merges `changes` into the state; null clears a key. `display`, `colour`, `layout` and `markers` each replace that part as a whole. */
  update(changes) {
    const next = normalise({ ...this.#state, ...changes });
    const same = (key) => next[key] === this.#state[key];
    if (VIEW_KEYS.every(same) && FLAG_KEYS.every(same) && sameDisplay(next.display, this.#state.display)
      && sameColour(next.colour, this.#state.colour) && sameLayout(next.layout, this.#state.layout)
      && sameMarkers(next.markers, this.#state.markers)) return;
    this.#state = next;
    // A sky position names one centre: a move drops it, so the URL never names a centre left earlier.
    if (!isSkyCentreOf(this.#sky, next)) this.#sky = null;
    this.#mirrorToUrl();
    this.dispatchEvent(new CustomEvent('change', { detail: next }));
  }

  #mirrorToUrl() {
    const url = `${this.#location.pathname}${formatViewQuery(this.#state, this.skyCentre)}${this.#location.hash}`;
    // replaceState: a pan is not a page the Back button should step through.
    this.#history.replaceState(this.#history.state, '', url);
  }
}
