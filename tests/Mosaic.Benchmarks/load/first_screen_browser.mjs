// Headless Chromium (Debian's) opening a link, driven over the DevTools protocol with Node's own WebSocket
// (node --experimental-websocket): the time from the start of navigation to the moment every tile image on
// screen has loaded, read from the page's own clock (performance.now()). Each measurement uses a fresh browser
// context (no HTTP cache) in a 1280 x 800 view.
//
//   node --experimental-websocket first_screen_browser.mjs LINK_URL
//
// Prints a REQUEST line per request of the first (cold) opening, start and end in ms from navigation start and the
// bytes transferred, then three FIGURE lines: the link with the server's tile cache as it is (cold when the server just started),
// the same link again in a new context (tiles now in the server's cache), and the baseline: the same tile URLs as
// bare <img> elements (no application code) in a new context, timed from their insertion.
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const link = process.argv[2];
if (!link) {
  console.error('usage: node --experimental-websocket first_screen_browser.mjs LINK_URL');
  process.exit(2);
}
const WIDTH = 1280;
const HEIGHT = 800;
const LIMIT_MS = 60000;

// Runs in every new document: notes when every tile image on screen has loaded (Leaflet's loaded class), checked
// every 5 ms.
const WATCHER = `(() => {
  const onScreen = (img) => {
    const r = img.getBoundingClientRect();
    return r.width > 0 && r.right > 0 && r.bottom > 0 && r.left < innerWidth && r.top < innerHeight;
  };
  const check = () => {
    const images = [...document.querySelectorAll('img.leaflet-tile')].filter(onScreen);
    const loaded = (img) => img.complete && img.naturalWidth > 0 && img.classList.contains('leaflet-tile-loaded');
    if (images.length > 0 && images.every(loaded)) {
      window.__firstScreen = { ms: performance.now(), tiles: images.length };
      return;
    }
    setTimeout(check, 5);
  };
  check();
})();`;

const profile = mkdtempSync(join(tmpdir(), 'mosaic-first-screen-'));
const chromium = spawn('chromium', ['--headless=new', '--remote-debugging-port=0', `--user-data-dir=${profile}`,
  `--window-size=${WIDTH},${HEIGHT}`, '--no-first-run', '--no-default-browser-check', '--disable-extensions',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
  // Chromium refuses to run as root with its sandbox (containers, CI).
  ...(process.getuid?.() === 0 ? ['--no-sandbox'] : []), 'about:blank'],
{ stdio: ['ignore', 'ignore', 'pipe'] });

async function finish(code) {
  chromium.kill('SIGTERM');
  await new Promise((resolve) => setTimeout(resolve, 300));
  rmSync(profile, { recursive: true, force: true });
  process.exit(code);
}

const endpoint = await new Promise((resolve, reject) => {
  let text = '';
  chromium.stderr.on('data', (chunk) => {
    text += chunk;
    const found = /DevTools listening on (ws:\/\/\S+)/.exec(text);
    if (found) resolve(found[1]);
  });
  chromium.on('exit', (code) => reject(new Error(`chromium exited (${code}): ${text.slice(-500)}`)));
  setTimeout(() => reject(new Error('chromium did not start within 30 s')), 30000);
}).catch(async (e) => {
  console.error(`first_screen_browser: ${e.message}`);
  await finish(1);
});

const socket = new WebSocket(endpoint);
await new Promise((resolve) => socket.addEventListener('open', resolve, { once: true }));
let nextId = 1;
const waiting = new Map();
socket.addEventListener('message', (event) => {
  const message = JSON.parse(event.data);
  const entry = waiting.get(message.id);
  if (!entry) return;
  waiting.delete(message.id);
  if (message.error) entry.reject(new Error(`${entry.method}: ${message.error.message}`));
  else entry.resolve(message.result);
});
function send(method, params = {}, sessionId = undefined) {
  const id = nextId++;
  socket.send(JSON.stringify({ id, method, params, ...(sessionId ? { sessionId } : {}) }));
  return new Promise((resolve, reject) => waiting.set(id, { resolve, reject, method }));
}

async function firstScreen(url, wait = true) {
  const { browserContextId } = await send('Target.createBrowserContext', { disposeOnDetach: true });
  const { targetId } = await send('Target.createTarget', { url: 'about:blank', browserContextId });
  const { sessionId } = await send('Target.attachToTarget', { targetId, flatten: true });
  await send('Page.enable', {}, sessionId);
  await send('Emulation.setDeviceMetricsOverride', { width: WIDTH, height: HEIGHT, deviceScaleFactor: 1, mobile: false }, sessionId);
  await send('Page.addScriptToEvaluateOnNewDocument', { source: WATCHER }, sessionId);
  await send('Page.navigate', { url }, sessionId);
  const started = Date.now();
  if (!wait) {
    await send('Target.closeTarget', { targetId });
    await send('Target.disposeBrowserContext', { browserContextId });
    return null;
  }
  for (;;) {
    const { result } = await send('Runtime.evaluate', {
      // Where the time went: scripts and styles, the API answers before the first tile asked, the tiles.
      expression: `window.__firstScreen ? (() => {
        const all = performance.getEntriesByType('resource');
        const tiles = all.filter((e) => e.name.includes('/tiles/'));
        const firstTile = Math.min(...tiles.map((e) => e.startTime));
        const end = (list) => Math.max(0, ...list.map((e) => e.responseEnd));
        const code = all.filter((e) => /[.](js|css)([?]|$)/.test(e.name));
        const api = all.filter((e) => e.name.includes('/api/') && e.startTime < firstTile);
        // Every request's start and end on the page's clock, in start order, for the cold run's waterfall.
        const short = (u) => u.replace(location.origin, '').replace(/[?].*$/, (q) => q.length > 25 ? q.slice(0, 24) + '…' : q);
        const nav = performance.getEntriesByType('navigation')[0];
        const timeline = [{ name: short(nav.name) + ' (page)', start: nav.startTime, end: nav.responseEnd, bytes: nav.transferSize },
          { name: 'DOMContentLoaded', start: nav.domContentLoadedEventStart, end: nav.domContentLoadedEventEnd, bytes: 0 },
          ...all.map((e) => ({ name: short(e.name), start: e.startTime, end: e.responseEnd, bytes: e.transferSize }))]
          .sort((a, b) => a.start - b.start);
        return JSON.stringify({ ...window.__firstScreen, urls: tiles.map((e) => e.name), timeline,
          steps: 'scripts_styles=' + code.length + '_done_at_' + end(code).toFixed(0) + 'ms api_before_tiles=' + api.length +
            '_done_at_' + end(api).toFixed(0) + 'ms (' + api.map((e) => e.name.replace(/^.*[/]api[/]/, '').replace(/[?].*$/, '') + '@' +
            e.startTime.toFixed(0) + '-' + e.responseEnd.toFixed(0)).join(',') + ') first_tile_asked_at=' + firstTile.toFixed(0) + 'ms last_tile_at=' + end(tiles).toFixed(0) + 'ms' });
      })() : ''`,
      returnByValue: true,
    }, sessionId);
    if (result.value) {
      await send('Target.closeTarget', { targetId });
      await send('Target.disposeBrowserContext', { browserContextId });
      return JSON.parse(result.value);
    }
    if (Date.now() - started > LIMIT_MS) throw new Error(`no complete first screen within ${LIMIT_MS} ms: ${url}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

// The baseline: on a page of the same origin (a small JSON answer of the server, so its headers apply as to the
// application's page), the same tile URLs as plain <img> elements, timed from their insertion to the last load.
async function bareImages(origin, urls) {
  const { browserContextId } = await send('Target.createBrowserContext', { disposeOnDetach: true });
  const { targetId } = await send('Target.createTarget', { url: 'about:blank', browserContextId });
  const { sessionId } = await send('Target.attachToTarget', { targetId, flatten: true });
  await send('Page.enable', {}, sessionId);
  await send('Emulation.setDeviceMetricsOverride', { width: WIDTH, height: HEIGHT, deviceScaleFactor: 1, mobile: false }, sessionId);
  const loaded = new Promise((resolve) => {
    const listener = (event) => {
      const message = JSON.parse(event.data);
      if (message.method === 'Page.loadEventFired' && message.sessionId === sessionId) {
        socket.removeEventListener('message', listener);
        resolve();
      }
    };
    socket.addEventListener('message', listener);
  });
  await send('Page.navigate', { url: `${origin}/api/palettes` }, sessionId);
  await loaded;
  const { result, exceptionDetails } = await send('Runtime.evaluate', {
    expression: `(async (urls) => {
      const started = performance.now();
      const images = urls.map((u) => {
        const img = new Image(64, 64);
        img.src = u;
        document.body.appendChild(img);
        return new Promise((resolve, reject) => { img.onload = resolve; img.onerror = () => reject(new Error('failed: ' + u)); });
      });
      await Promise.all(images);
      return JSON.stringify({ ms: performance.now() - started, tiles: urls.length, urls });
    })(${JSON.stringify(urls)})`,
    awaitPromise: true,
    returnByValue: true,
  }, sessionId);
  if (exceptionDetails) throw new Error(`bare page: ${exceptionDetails.exception?.description ?? exceptionDetails.text}`);
  await send('Target.closeTarget', { targetId });
  await send('Target.disposeBrowserContext', { browserContextId });
  return JSON.parse(result.value);
}

try {
  await firstScreen('about:blank', false); // the browser's own start-up is not counted
  const cold = await firstScreen(link);
  const again = await firstScreen(link);
  const bare = await bareImages(new URL(link).origin, [...new Set(cold.urls)]);
  const line = (what, r) => console.log(`FIGURE ${what} ms=${r.ms.toFixed(0)} tiles_on_screen=${r.tiles} tile_requests=${r.urls.length}${r.steps ? ' ' + r.steps : ''}`);
  for (const e of cold.timeline) {
    console.log(`REQUEST ${e.start.toFixed(0).padStart(5)}-${e.end.toFixed(0).padStart(5)} ms ${String(e.bytes).padStart(7)} B ${e.name}`);
  }
  line('link_server_cache_cold', cold);
  line('link_server_cache_warm', again);
  line('baseline_bare_img_page', bare);
  await finish(0);
} catch (e) {
  console.error(`first_screen_browser: ${e.message}`);
  await finish(1);
}
