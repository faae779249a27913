// The server's HTTP API. Paths are relative to the page so the app also works behind a proxy under a sub-path.
import { ApiError } from './api-error.js';

async function getJson(path, signal) {
  const response = await fetch(path, { signal, headers: { Accept: 'application/json' } });
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

/** A Leaflet URL template for the tiles of one HDU. */
export function tileUrlTemplate({ field, band, hdu }) {
  const query = new URLSearchParams({ band, hdu: String(hdu) });
  return `tiles/${encodeURIComponent(field)}/{z}/{x}/{y}.png?${query}`;
}
