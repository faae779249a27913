// Links to a view, and opening them. Other modules build and open links only through this file:
//   readLink(search)            what a link asks for: {version, view, sky, problem} (see below)
//   currentLinkQuery()          the view on screen as a link query, '?v=1&field=…&ra=…&dec=…&z=…&…'
//   currentLinkState()          the same as a view state object for the wire: {"v": "1", "field": …} (string → string)
//   linkQueryOf(stateObject)    a view state object (saved views, meetings) back to a link query
//   openLinkQuery(query)        opens a link query in this page
// Link format version 1 (`v=1`) names the centre by `ra`/`dec` (ICRS degrees, 7 decimals) where the HDU viewed has
// a celestial WCS and the centre lies on it, else by `x`/`y` (FITS pixels, 1-based); a link without `v` is
// version 0, made before, and carries `x`/`y`. Pixels are exact; RA/Dec keep naming the same spot of sky when a
// field's whole-field grid is laid out anew (new chips, another centre).
import { LINK_VERSION, formatSky, formatViewQuery, parseViewQuery, roundCentre } from './state.js';
import { probePixel, probeSky } from './api.js';
import { isWholeField } from './whole-field.js';

const KNOWN_VERSIONS = Object.freeze(['0', String(LINK_VERSION)]);

function parseDegrees(text, low, high) {
  const trimmed = text?.trim();
  if (!trimmed) return null;
  const value = Number(trimmed);
  return Number.isFinite(value) && value >= low && value <= high ? value : null;
}

/**
 * What a link asks for: `version` (0, 1, or null when its `v` is one this page does not know), `view` (the state to
 * start from: only the field for an unknown version; no pixel centre when the centre is on the sky), `sky` ({ra,
 * dec} to be found on the HDU, or null) and `problem`, a sentence for the message line, or null.
 */
export function readLink(search) {
  const query = new URLSearchParams(search);
  const given = query.get('v');
  const view = parseViewQuery(search);
  if (given !== null && !KNOWN_VERSIONS.includes(given.trim())) {
    return {
      version: null,
      view: { field: view.field },
      sky: null,
      problem: `This link is in format version “${given}”, which this viewer cannot read (it reads ${KNOWN_VERSIONS.join(' and ')}): showing the field's default view instead.`,
    };
  }
  const version = given === null ? 0 : Number(given.trim());
  if (version === 0 || (query.get('ra') === null && query.get('dec') === null)) return { version, view, sky: null, problem: null };
  const ra = parseDegrees(query.get('ra'), 0, 360);
  const dec = parseDegrees(query.get('dec'), -90, 90);
  const centreless = { ...view, x: null, y: null };
  if (ra === null || dec === null) {
    return {
      version,
      view: centreless,
      sky: null,
      problem: `The link's centre is not a sky position (ra = “${query.get('ra') ?? ''}”, dec = “${query.get('dec') ?? ''}”: decimal degrees, RA 0 to 360, Dec -90 to +90): showing the default view instead.`,
    };
  }
  return { version, view: centreless, sky: { ra, dec }, problem: null };
}

/** A view state object (flat, string → string; repeated parameters joined by a newline) as a link query. */
export function linkQueryOf(stateObject) {
  const query = new URLSearchParams();
  for (const [name, value] of Object.entries(stateObject)) {
    for (const part of String(value).split('\n')) query.append(name, part);
  }
  const text = query.toString();
  return text ? `?${text}` : '';
}

/** A link query as a view state object: the inverse of linkQueryOf. */
export function stateObjectOf(linkQuery) {
  const object = {};
  for (const [name, value] of new URLSearchParams(linkQuery)) {
    object[name] = Object.hasOwn(object, name) ? `${object[name]}\n${value}` : value;
  }
  return object;
}

let current = null;

/** The view on screen as a link query, the centre on the sky where it can be. */
export function currentLinkQuery() {
  if (current === null) return Promise.reject(new Error('no view is open yet'));
  return current.linkQuery();
}

/** The view on screen as a view state object, for saved views and meetings. */
export async function currentLinkState() {
  return stateObjectOf(await currentLinkQuery());
}

/** Opens a link query (as currentLinkQuery gives, or linkQueryOf a stored state) in this page. */
export function openLinkQuery(query, location = window.location) {
  const text = query.startsWith('?') ? query : `?${query}`;
  location.assign(`${location.pathname}${text}`);
}

/**
 * Keeps the sky position of the view's centre: after every move of a centre on an HDU with a celestial WCS it asks
 * the server (the probe, exact through the HDU's own WCS) and hands the answer to the state, which then writes
 * the URL with RA/Dec. Until the answer is in, and where there is none (off the image, no WCS), the URL keeps the
 * exact pixel centre, so it always opens the view on screen.
 */
export class ViewLink {
  #state;
  #toSky;
  #toPixel;
  #source = null;
  #hasSky = false;
  #size = null;
  #request = null;

  constructor(state, { toSky = probePixel, toPixel = probeSky } = {}) {
    this.#state = state;
    this.#toSky = toSky;
    this.#toPixel = toPixel;
    state.addEventListener('change', () => this.#refresh());
    current = this;
  }

  /**
   * The HDU on screen ({field, band, hdu}: the band whose chips are shown), whether it has a celestial WCS, and its
   * size ({width, height}): a centre off its pixels keeps the pixel form without asking.
   */
  setSource(source, hasSky, size) {
    this.#request?.controller.abort();
    this.#request = null;
    this.#source = source;
    this.#hasSky = hasSky;
    this.#size = size;
    this.#refresh();
  }

  /** The link query of the view now, once the sky position of its centre has come (or failed to). */
  async linkQuery() {
    while (this.#request !== null) {
      const { promise } = this.#request;
      await promise;
      if (this.#request?.promise === promise) break;
    }
    return formatViewQuery(this.#state.current, this.#state.skyCentre);
  }

  /**
   * The view a sky link opens on `source` (as open() will show it): its centre found on that HDU through the
   * server, rounded as the state keeps it. Rejects with the server's reason when the position is off that HDU.
   */
  async land(source, sky, z, signal) {
    const answer = await this.#toPixel(source, sky.ra, sky.dec, signal);
    const point = isWholeField(source.hdu) ? answer.canvas : { x: answer.atX, y: answer.atY };
    if (!Number.isFinite(point?.x) || !Number.isFinite(point?.y)) throw new Error('the server gave no pixel for it');
    return { x: roundCentre(point.x), y: roundCentre(point.y), z };
  }

  // FITS pixel i covers [i - 0.5, i + 0.5): the probe answers only on the image.
  #onImage(x, y) {
    const size = this.#size;
    return size !== null && x >= 0.5 && x < size.width + 0.5 && y >= 0.5 && y < size.height + 0.5;
  }

  #refresh() {
    const now = this.#state.current;
    if (this.#state.skyCentre !== null) return;
    const key = JSON.stringify([now.field, now.band, now.hdu, now.x, now.y]);
    if (this.#request?.key === key) return;
    this.#request?.controller.abort();
    this.#request = null;
    const source = this.#source;
    if (!this.#hasSky || source === null || now.x === null || now.y === null
      || source.field !== now.field || source.hdu !== now.hdu || !this.#onImage(now.x, now.y)) return;
    const centre = { field: now.field, band: now.band, hdu: now.hdu, x: now.x, y: now.y };
    const controller = new AbortController();
    const promise = this.#toSky(source, now.x, now.y, controller.signal)
      .then((answer) => {
        if (controller.signal.aborted || !Number.isFinite(answer?.ra) || !Number.isFinite(answer?.dec)) return;
        // Written as the link writes it, so the state holds what a link opened elsewhere reads.
        const text = formatSky(answer.ra, answer.dec);
        this.#state.setSkyCentre({ ...centre, ra: Number(text.ra), dec: Number(text.dec) });
      })
      // The server out of reach, or the HDU gone: the link keeps the exact pixel centre.
      .catch(() => {})
      .finally(() => {
        if (this.#request?.controller === controller) this.#request = null;
      });
    this.#request = { key, controller, promise };
  }
}
