// The page's first API requests. index.html preloads them and loads this file as a module of its own (async, no
// imports), so it runs while the rest of the modules are still loading, and app.js's graph imports the same
// instance. Each answer is read (JSON parsed) as soon as it arrives, so app.js finds it ready when it starts. api.js
// takes each answer once; any later call asks the server again.
const EARLY = ['api/fields', 'api/palettes'];

// No request headers of our own: the browser hands a fetch the preloaded answer only when they match the preload's.
const started = new Map(EARLY.map((path) => [path, fetch(path).then(async (response) => ({
  response,
  body: response.ok ? await response.json() : undefined,
}))]));
// Until taken, a failure is only remembered: api.js asks again and reports that one.
for (const request of started.values()) request.catch(() => {});

/** The answer already on its way for `path` (once): {response, body}, body parsed when the status is a success; or null. */
export function takeStarted(path) {
  const request = started.get(path) ?? null;
  started.delete(path);
  return request;
}
