// The server requests behind links and saved views: the sky position of a view's centre and back, and the saved
// views store. Paths are relative to the page, as in api.js, so the app also works under a sub-path.
import { ApiError } from './api-error.js';

async function send(path, { method = 'GET', body = undefined, signal = undefined } = {}) {
  const headers = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  const response = await fetch(path, { method, signal, headers, body: body === undefined ? undefined : JSON.stringify(body) });
  if (!response.ok) throw await ApiError.fromResponse(response);
  return response.status === 204 ? null : response.json();
}

function probePath(field, query) {
  return `api/fields/${encodeURIComponent(field)}/probe?${query}`;
}

/** The sky position (`ra`, `dec`, ICRS degrees; null without a WCS) of FITS point (x, y) of one HDU, or `canvas`. */
export function skyOfPixel({ field, band, hdu }, x, y, signal) {
  const query = new URLSearchParams({ band, hdu: String(hdu), x: String(x), y: String(y) });
  return send(probePath(field, query), { signal });
}

/**
 * Where ICRS position (ra, dec) in degrees falls on one HDU: the answer's `atX`/`atY`, or on the whole field
 * (`hdu: 'canvas'`) its `canvas` {x, y}. 404 when the position is off that HDU.
 */
export function pixelOfSky({ field, band, hdu }, ra, dec, signal) {
  const query = new URLSearchParams({ band, hdu: String(hdu), ra: String(ra), dec: String(dec) });
  return send(probePath(field, query), { signal });
}

/** Saves a view ({state, title?, note?}); the answer carries `id`, `url`, `deleteKey` and the stored view. */
export function saveView(view, signal) {
  return send('api/views', { method: 'POST', body: view, signal });
}

/** The saved views of a field, newest first. */
export function listViews(field, signal) {
  return send(`api/views?${new URLSearchParams({ field })}`, { signal });
}

/** Deletes a saved view; the server refuses (403) without the key it gave when the view was saved. */
export function deleteView(id, key, signal) {
  return send(`api/views/${encodeURIComponent(id)}?${new URLSearchParams({ key })}`, { method: 'DELETE', signal });
}
