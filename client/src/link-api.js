// The server requests of the saved views store. Paths are relative to the page, as in api.js, so the app also
// works under a sub-path.
import { ApiError } from './api-error.js';

async function send(path, { method = 'GET', body = undefined, signal = undefined } = {}) {
  const headers = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  const response = await fetch(path, { method, signal, headers, body: body === undefined ? undefined : JSON.stringify(body) });
  if (!response.ok) throw await ApiError.fromResponse(response);
  return response.status === 204 ? null : response.json();
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
