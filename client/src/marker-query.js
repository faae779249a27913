// Markers of regions of interest as one page URL parameter, `mk`: the markers joined by `*`, each a kind letter
// and its fields joined by `_`, the label last (it may hold `_`; a `*` or `%` in it is written %2A / %25). Both
// separators are characters a query string keeps as they are, so a link stays short and readable:
//   p<ra>_<dec>[_label]                    a point on the sky (ICRS decimal degrees)
//   c<ra>_<dec>_<radius>[_label]           a circle on the sky, radius in arcsec
//   b<ra>_<dec>_<width>_<height>[_label]   a box on the sky aligned with east (width) and north (height), arcsec
//   P<hdu>_<x>_<y>[_label], C<hdu>_<x>_<y>_<radius>[_label], B<hdu>_<x>_<y>_<width>_<height>[_label]
//                                          the same in FITS pixels (1-based) of one HDU (an index, or `canvas`),
//                                          for images without a WCS; sizes in pixels, boxes along the pixel axes.
// e.g. ?mk=c150.1234567_2.3456789_12.5_Bright+knot*p150.2_2.3

export const MARKER_PARAMETER = 'mk';
export const MARKER_KINDS = Object.freeze(['point', 'circle', 'box']);
/** Enough for any region list kept by hand, and short of the saved views' 16 KiB state limit. */
export const MAX_MARKERS = 100;
export const MAX_LABEL = 60;
/** Arcsec (or pixels): a marker larger than a few degrees is not a region of interest in one field. */
export const MAX_SIZE = 36000;

export const EMPTY_MARKERS = Object.freeze([]);
const NORMALISED = new WeakSet([EMPTY_MARKERS]);

const LETTERS = Object.freeze({ point: 'p', circle: 'c', box: 'b' });
const KINDS_BY_LETTER = Object.freeze({ p: 'point', c: 'circle', b: 'box' });
const SIZE_COUNT = Object.freeze({ point: 0, circle: 1, box: 2 });
// 1e-7 degree is 0.36 mas: far below any pixel, and the precision the view centre's link uses.
const SKY_DECIMALS = 7;
const SIZE_DECIMALS = 3;
const PIXEL_DECIMALS = 2;
const HDU = /^(\d{1,6}|canvas)$/;

function round(value, decimals) {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
}

function finite(value) {
  const n = typeof value === 'string' ? (value.trim() === '' ? NaN : Number(value)) : value;
  return typeof n === 'number' && Number.isFinite(n) ? n : null;
}

function sizeOf(value, pixels) {
  const n = finite(value);
  return n !== null && n > 0 && n <= MAX_SIZE ? round(n, pixels ? PIXEL_DECIMALS : SIZE_DECIMALS) : null;
}

function labelOf(value) {
  if (typeof value !== 'string') return '';
  // Control characters would break the CSV and the one-line list.
  return value.replace(/[\u0000-\u001f\u007f]/g, ' ').trim().slice(0, MAX_LABEL);
}

function hduOf(value) {
  if (Number.isInteger(value) && value >= 0) return value;
  const text = typeof value === 'string' ? value.trim().toLowerCase() : '';
  if (!HDU.test(text)) return null;
  return text === 'canvas' ? 'canvas' : Number(text);
}

/**
 * One marker with every unusable value dropped, or null when it cannot be kept: {kind, sky, ra, dec} on the sky
 * or {kind, sky: false, hdu, x, y} in pixels, with `radius` (circle) or `width` and `height` (box), and `label`.
 */
export function normaliseMarker(raw) {
  if (raw === null || typeof raw !== 'object' || !MARKER_KINDS.includes(raw.kind)) return null;
  const sky = raw.sky !== false;
  const marker = { kind: raw.kind, sky };
  if (sky) {
    const ra = finite(raw.ra);
    const dec = finite(raw.dec);
    if (ra === null || dec === null || dec < -90 || dec > 90) return null;
    marker.ra = round(((ra % 360) + 360) % 360, SKY_DECIMALS);
    if (marker.ra === 360) marker.ra = 0;
    marker.dec = round(dec, SKY_DECIMALS);
  } else {
    const hdu = hduOf(raw.hdu);
    const x = finite(raw.x);
    const y = finite(raw.y);
    if (hdu === null || x === null || y === null) return null;
    Object.assign(marker, { hdu, x: round(x, PIXEL_DECIMALS), y: round(y, PIXEL_DECIMALS) });
  }
  if (raw.kind === 'circle') {
    marker.radius = sizeOf(raw.radius, !sky);
    if (marker.radius === null) return null;
  } else if (raw.kind === 'box') {
    marker.width = sizeOf(raw.width, !sky);
    marker.height = sizeOf(raw.height, !sky);
    if (marker.width === null || marker.height === null) return null;
  }
  marker.label = labelOf(raw.label);
  return Object.freeze(marker);
}

/** The markers that can be kept, at most MAX_MARKERS, as a frozen array. */
export function normaliseMarkers(list) {
  if (!Array.isArray(list)) return EMPTY_MARKERS;
  // A list this function made is kept as it is: the state normalises on every pan, and the layer redraws only
  // when the list itself changes.
  if (NORMALISED.has(list)) return list;
  const kept = list.map(normaliseMarker).filter((marker) => marker !== null).slice(0, MAX_MARKERS);
  if (kept.length === 0) return EMPTY_MARKERS;
  const frozen = Object.freeze(kept);
  NORMALISED.add(frozen);
  return frozen;
}

function number(value) {
  return String(value);
}

function escapeLabel(label) {
  return label.replace(/%/g, '%25').replace(/\*/g, '%2A');
}

function unescapeLabel(text) {
  return text.replace(/%2A/gi, '*').replace(/%25/g, '%');
}

/** One marker as its URL token. */
export function formatMarker(marker) {
  const sizes = marker.kind === 'circle' ? [marker.radius] : marker.kind === 'box' ? [marker.width, marker.height] : [];
  const letter = LETTERS[marker.kind];
  const fields = marker.sky
    ? [`${letter}${number(marker.ra)}`, number(marker.dec)]
    : [`${letter.toUpperCase()}${marker.hdu}`, number(marker.x), number(marker.y)];
  fields.push(...sizes.map(number));
  if (marker.label !== '') fields.push(escapeLabel(marker.label));
  return fields.join('_');
}

/** A URL token back to a marker, or null when it is not one. */
export function parseMarker(token) {
  const letter = token.charAt(0);
  const kind = KINDS_BY_LETTER[letter.toLowerCase()];
  if (kind === undefined) return null;
  const sky = letter === letter.toLowerCase();
  const parts = token.slice(1).split('_');
  const count = (sky ? 2 : 3) + SIZE_COUNT[kind];
  if (parts.length < count) return null;
  const fixed = parts.slice(0, count);
  const label = unescapeLabel(parts.slice(count).join('_'));
  const sizes = fixed.slice(sky ? 2 : 3);
  const raw = sky ? { kind, sky, ra: fixed[0], dec: fixed[1], label } : { kind, sky, hdu: fixed[0], x: fixed[1], y: fixed[2], label };
  if (kind === 'circle') raw.radius = sizes[0];
  if (kind === 'box') [raw.width, raw.height] = sizes;
  return normaliseMarker(raw);
}

/** The markers of a page query (URLSearchParams or text); tokens that are not markers are left out. */
export function parseMarkerQuery(search) {
  const query = search instanceof URLSearchParams ? search : new URLSearchParams(search);
  const text = query.get(MARKER_PARAMETER);
  if (text === null || text.trim() === '') return EMPTY_MARKERS;
  return normaliseMarkers(text.split('*').map((token) => parseMarker(token.trim())));
}

/** Tokens of `mk` that are not markers (or past the limit), for telling the person opening a link. */
export function droppedMarkers(search) {
  const query = search instanceof URLSearchParams ? search : new URLSearchParams(search);
  const text = query.get(MARKER_PARAMETER);
  if (text === null || text.trim() === '') return 0;
  const tokens = text.split('*');
  return tokens.length - parseMarkerQuery(query).length;
}

/** [name, value] pairs for the page URL: none without markers. */
export function markerParameters(markers) {
  return markers.length === 0 ? [] : [[MARKER_PARAMETER, markers.map(formatMarker).join('*')]];
}

export function sameMarkers(a, b) {
  return a.length === b.length && a.every((marker, i) => formatMarker(marker) === formatMarker(b[i]));
}
