// How the image area is laid out, as page URL parameters (never sent to the server): `view` (absent: one image;
// `panes`: the three channel bands side by side; `swipe` or `blink`: two layers compared), the layers compared
// (`first`, `second`: a band name or `composite`), where the swipe divider stands (`divider`, a share of the view's
// width) and the blink interval (`blink`, milliseconds), and each pane's palette (`pane-palettes`, three names).

export const VIEWS = Object.freeze(['panes', 'swipe', 'blink']);
export const COMPOSITE_LAYER = 'composite';
export const LAYOUT_DEFAULTS = Object.freeze({ divider: 0.5, blink: 800 });
export const BLINK_RANGE = Object.freeze({ min: 100, max: 10000 });

const LAYER = /^[^\s,&=?#]{1,64}$/;
const PALETTE_NAME = /^[a-z0-9][a-z0-9-]{0,39}$/;

export const EMPTY_LAYOUT = Object.freeze({ view: null, first: null, second: null, divider: null, blink: null, panePalettes: null });

function layerOf(value) {
  return typeof value === 'string' && LAYER.test(value.trim()) ? value.trim() : null;
}

function palettesOf(value) {
  const items = Array.isArray(value) ? value : typeof value === 'string' ? value.split(',') : null;
  if (items === null || items.length !== 3) return null;
  const names = items.map((item) => (typeof item === 'string' ? item.trim().toLowerCase() : ''));
  return names.every((name) => PALETTE_NAME.test(name)) ? Object.freeze(names) : null;
}

function dividerOf(value) {
  const n = typeof value === 'string' ? Number(value) : value;
  return typeof n === 'number' && Number.isFinite(n) && n >= 0 && n <= 1 ? Math.round(n * 1000) / 1000 : null;
}

function blinkOf(value) {
  const n = typeof value === 'string' ? Number(value) : value;
  return typeof n === 'number' && Number.isFinite(n) && n >= BLINK_RANGE.min && n <= BLINK_RANGE.max ? Math.round(n) : null;
}

/** The layout with unusable or unused values dropped. */
export function normaliseLayout(raw = {}) {
  const view = VIEWS.includes(raw.view) ? raw.view : null;
  const comparing = view === 'swipe' || view === 'blink';
  return Object.freeze({
    view,
    first: comparing ? layerOf(raw.first) : null,
    second: comparing ? layerOf(raw.second) : null,
    divider: view === 'swipe' ? dividerOf(raw.divider) : null,
    blink: view === 'blink' ? blinkOf(raw.blink) : null,
    panePalettes: view === 'panes' ? palettesOf(raw.panePalettes) : null,
  });
}

const NAMES = Object.freeze({ view: 'view', first: 'first', second: 'second', divider: 'divider', blink: 'blink', panePalettes: 'pane-palettes' });

export function parseLayoutQuery(search) {
  const query = search instanceof URLSearchParams ? search : new URLSearchParams(search);
  const raw = {};
  for (const [key, name] of Object.entries(NAMES)) {
    const value = query.get(name);
    if (value !== null && value.trim() !== '') raw[key] = value.trim();
  }
  return normaliseLayout(raw);
}

export function layoutParameters(layout) {
  const pairs = [];
  for (const [key, name] of Object.entries(NAMES)) {
    const value = layout[key];
    if (value !== null && value !== undefined) pairs.push([name, Array.isArray(value) ? value.join(',') : String(value)]);
  }
  return pairs;
}

export function sameLayout(a, b) {
  return new URLSearchParams(layoutParameters(a)).toString() === new URLSearchParams(layoutParameters(b)).toString();
}
