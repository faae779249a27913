// Wires the controls together: the pickers choose what to show, the display panel how to draw it, the image view
// shows it, and the view state (and so the URL) follows all three.
import { listFields, getField, tileUrlTemplate, compositeTileUrlTemplate, getCompositeDisplay, listPalettes, probePosition } from './api.js';
import { ViewState } from './state.js';
import { ImageView } from './image-view.js';
import { FieldPicker } from './field-picker.js';
import { BandPicker } from './band-picker.js';
import { HduPicker } from './hdu-picker.js';
import { PixelReadout } from './pixel-readout.js';
import { BuildProgress } from './build-progress.js';
import { FieldWatcher } from './field-watcher.js';
import { MessageLine } from './message-line.js';
import { DisplayPanel } from './display-panel.js';
import { DisplaySync } from './display-sync.js';
import { sameDisplay, droppedParameters } from './display-query.js';
import { CHANNELS, channelBands, sameColour } from './colour-query.js';
import { COMPOSITE_LAYER, LAYOUT_DEFAULTS, sameLayout } from './layout-query.js';
import { defaultChannels } from './band-order.js';
import { probeChannels } from './channel-probe.js';
import { ColourControls, readResolvedColour } from './colour-controls.js';
import { LayoutControls } from './layout-controls.js';
import { PaneGrid } from './pane-grid.js';
import { setSectionActive } from './section-state.js';
import { GotoBox } from './goto-box.js';
import { createPositionMarker } from './position-marker.js';
import { GridToggle } from './grid-toggle.js';
import { SkySync } from './sky-sync.js';
import { SkyGrid } from './sky-grid.js';
import { Compass } from './compass.js';
import { ScaleBar } from './scale-bar.js';
import { WHOLE_FIELD, isWholeField, wholeFieldEntry, bandEntries } from './whole-field.js';
import { ChipOutlines } from './chip-outlines.js';
import { OutlineToggle } from './outline-toggle.js';
import { MarkerControls } from './marker-controls.js';
import { ExportPanel } from './export-panel.js';
import { ViewLink, readLink, currentLinkState } from './view-link.js';
import { SharePanel } from './share-panel.js';
import { Meeting } from './meeting.js';

// A link of a format version this page cannot read opens only its field (view-link.js says why).
const opening = readLink(location.search);
const state = new ViewState(opening.view);
const viewLink = new ViewLink(state);
const share = new SharePanel(document.getElementById('share-panel'), document.getElementById('share-toggle'), state, viewLink, currentLinkState);
const imageView = new ImageView(document.getElementById('image-view'));
const fieldPicker = new FieldPicker(document.getElementById('field-picker'), document.getElementById('field-note'));
const bandPicker = new BandPicker(document.getElementById('band-picker'));
const hduPicker = new HduPicker(document.getElementById('hdu-picker'));
const readout = new PixelReadout(document.getElementById('pixel-readout'), probeChannels);
const progress = new BuildProgress(document.getElementById('build-progress'));
const message = new MessageLine(document.getElementById('message'));
const watcher = new FieldWatcher();
// The page's own masked colour (app.css), used while the URL names none.
const defaultMask = getComputedStyle(document.documentElement).getPropertyValue('--mask-colour').trim().slice(1).toLowerCase();
const panel = new DisplayPanel(document.getElementById('display-panel'), { defaultMask });
const sync = new DisplaySync(panel);
const panelRoot = document.getElementById('display-panel');
const colourControls = new ColourControls(panelRoot.querySelector('[data-role=colour-section]'));
const layoutControls = new LayoutControls(panelRoot.querySelector('[data-role=layout-section]'));
const stage = document.querySelector('.stage');
const panes = new PaneGrid(document.getElementById('pane-grid'));
const bandSelect = document.getElementById('band-picker');
const gotoBox = new GotoBox(document.getElementById('goto-box'), probePosition);
const gridToggle = new GridToggle(document.getElementById('grid-toggle'));
const skySync = new SkySync();
const grid = new SkyGrid(imageView);
const compass = new Compass(document.getElementById('compass'));
const scaleBar = new ScaleBar(document.getElementById('scale-bar'));
const outlines = new ChipOutlines(imageView);
const outlineToggle = new OutlineToggle(document.getElementById('outline-toggle'), document.getElementById('canvas-note'));
const markers = new MarkerControls(state, imageView, message);
const exportPanel = new ExportPanel(document.getElementById('export-panel'), document.getElementById('export-toggle'),
  document.getElementById('image-view'), { imageView, markerLayer: markers.layer, state });
const meeting = new Meeting({
  root: document.getElementById('meeting-panel'), toggle: document.getElementById('meeting-toggle'), stage, state, imageView,
  viewElement: document.getElementById('image-view'), showView,
  guarded: [panelRoot, ...['field-picker', 'band-picker', 'hdu-picker', 'goto-box'].map((id) => document.getElementById(id))],
});

let fields = [];
let field = null;
// The HDU on screen: {field, band, hdu} plus whether its tiles were ready when last seen, and its `sky`. In a
// colour mode `band` is the red channel's, whose chips the chip picker lists.
let shown = null;
// The geometry of what the image view shows, so a new display restyles the tiles instead of replacing them.
let shownGeometry = null;
let compositeRequest = null;
// The go-to mark: {marker, field, band, hdu}; shown only over the HDU it was found on.
let mark = null;
// Arcsec per image pixel near the middle of the view: from the newest /sky answer, else the HDU's own.
let pixelScale = null;

const isPreparing = (hdu) => hdu.pyramid?.state === 'queued' || hdu.pyramid?.state === 'building';

function readableBand(candidate, name) {
  return candidate.bands.find((band) => band.name === name && !band.error && band.hdus.length > 0) ?? null;
}

function readableNames(candidate) {
  return candidate.bands.filter((band) => !band.error && band.hdus.length > 0).map((band) => band.name);
}

function pickBand(candidate, name) {
  return readableBand(candidate, name)
    ?? readableBand(candidate, candidate.defaultBand)
    ?? candidate.bands.find((band) => !band.error && band.hdus.length > 0)
    ?? null;
}

// The whole field when asked for or when nothing is (a band with a canvas opens on it); a chip when one is named,
// so old links keep opening their chip.
function pickHdu(band, index, fallback) {
  const whole = wholeFieldEntry(band);
  if (whole !== null && (index === null || isWholeField(index))) return whole;
  return band.hdus.find((hdu) => hdu.index === index)
    ?? whole
    ?? band.hdus.find((hdu) => hdu.index === fallback)
    ?? band.hdus[0];
}

/** The band of each channel: the one the state names where the field can show it, else the default. */
function channelsOf(candidate, colour) {
  const names = readableNames(candidate);
  const defaults = defaultChannels(names);
  const asked = channelBands(colour, defaults);
  return Object.fromEntries(CHANNELS.map((channel) => [channel, names.includes(asked[channel]) ? asked[channel] : defaults[channel]]));
}

// The layers compared: those the state names where they can be shown, else the composite (or the band) against
// another band.
function compareLayers(candidate, colour, layout, channels) {
  const names = readableNames(candidate);
  const usable = (token) => (token === COMPOSITE_LAYER ? colour.rgb !== null : names.includes(token));
  const main = colour.rgb !== null ? COMPOSITE_LAYER : shown?.band ?? names[0];
  const first = usable(layout.first) ? layout.first : main;
  const fallbackSecond = first === COMPOSITE_LAYER ? channels.red : names.find((name) => name !== first) ?? first;
  const second = usable(layout.second) ? layout.second : fallbackSecond;
  return { first, second };
}

function layerUrl(token, hduIndex, onField = field) {
  const { display, colour } = state.current;
  if (token === COMPOSITE_LAYER) {
    return compositeTileUrlTemplate({ field: onField.id, hdu: hduIndex }, display, { ...colour, ...channelsOf(onField, colour) });
  }
  return tileUrlTemplate({ field: onField.id, band: token, hdu: hduIndex }, display);
}

function layerLabel(token) {
  return token === COMPOSITE_LAYER ? 'colour composite' : `band ${token}`;
}

function open(candidate, { band: bandName = null, hdu: hduIndex = null, view = null } = {}) {
  const { colour } = state.current;
  const colourMode = colour.rgb !== null;
  const channels = channelsOf(candidate, colour);
  const band = colourMode ? readableBand(candidate, channels.red) : pickBand(candidate, bandName);
  if (band === null) {
    message.show(`Field “${candidate.id}” has no band that can be shown${candidate.error ? `: ${candidate.error}` : '.'}`);
    return;
  }
  field = candidate;
  const hdu = pickHdu(band, hduIndex, candidate.defaultHdu);
  const source = { field: candidate.id, band: band.name, hdu: hdu.index };

  fieldPicker.setFields(fields, candidate.id);
  bandPicker.setBands(candidate.bands, colourMode ? state.current.band ?? band.name : band.name);
  hduPicker.setHdus(bandEntries(band), hdu.index);
  state.update(colourMode ? { field: candidate.id, hdu: hdu.index, band: state.current.band ?? candidate.defaultBand } : source);
  colourControls.setBands(readableNames(candidate));
  const wholeField = isWholeField(hdu.index);
  outlines.show(wholeField ? hdu.chips : []);
  outlineToggle.setCanvas(wholeField ? hdu : null);

  shown = { ...source, ready: hdu.pyramid?.state === 'ready', sky: hdu.sky ?? null };
  viewLink.setSource(source, shown.sky !== null, { width: hdu.width, height: hdu.height });
  share.setField(candidate.id);
  shownGeometry = null;
  showSky(source, hdu);
  render(view);
  panel.limits.fitEnabled = true;
  sync.update(source, state.current.display);
  progress.show(hdu.name, hdu.pyramid);
  watchPreparation(band);
  refreshSky();
}

// The sky overlays for a newly shown HDU: the go-to mark only over its own HDU, grid and compass from scratch.
function showSky(source, hdu) {
  const hasSky = hdu.sky !== null && hdu.sky !== undefined;
  if (mark !== null && !(mark.field === source.field && mark.band === source.band && mark.hdu === source.hdu)) clearMark();
  // On the whole field the server finds the chip and says where the position is on the field's own grid.
  gotoBox.setSource({ field: source.field, band: source.band, hdu: isWholeField(source.hdu) ? WHOLE_FIELD : null });
  gridToggle.setAvailable(hasSky, hdu.skyError);
  pixelScale = hasSky && Number.isFinite(hdu.sky.pixelScale) ? hdu.sky.pixelScale : null;
  skySync.setSource(source, hasSky);
  markers.setSource(source, hasSky);
}

// After every pan and zoom: the scale bar follows at once, the grid and compass when the server answers.
function refreshSky() {
  const screen = imageView.screen;
  if (screen !== null && pixelScale !== null) scaleBar.show(pixelScale, screen.scale);
  else scaleBar.hide();
  skySync.update(screen);
}

function onSky({ answer, scale }) {
  if (Number.isFinite(answer.pixelScale) && answer.pixelScale > 0) pixelScale = answer.pixelScale;
  const screen = imageView.screen;
  if (pixelScale !== null) scaleBar.show(pixelScale, screen?.scale ?? scale);
  compass.show(answer.north ?? null, answer.east ?? null);
  grid.show(answer.grid ?? null, screen?.imageWidth ?? null, screen?.imageHeight ?? null);
}

function onSkyCleared(error) {
  compass.hide();
  grid.show(null);
  if (error) message.show(`No coordinate grid here: ${error.detail || error.message}`, 'sky');
  else message.clear('sky');
}

function setGrid(on) {
  grid.on = on;
  gridToggle.pressed = on;
  state.update({ grid: on });
}

function setOutlines(on) {
  outlines.on = on;
  outlineToggle.pressed = on;
  state.update({ outlines: on });
}

function clearMark() {
  if (mark === null) return;
  imageView.removeOverlay(mark.marker);
  mark = null;
  gotoBox.marked = false;
}

function placeMark(x, y, text, target) {
  const marker = createPositionMarker(x, y, text);
  imageView.addOverlay(marker);
  mark = { marker, ...target };
  gotoBox.marked = true;
}

// On the whole field the view moves to where the position is on it, whichever chip holds it.
function goToOnWholeField(answer) {
  const at = answer.canvas;
  if (!at || !Number.isFinite(at.x) || !Number.isFinite(at.y)) {
    message.show('Go to: the server did not say where that position is on the whole field.', 'goto');
    return;
  }
  clearMark();
  imageView.centreOn(at.x, at.y);
  placeMark(at.x, at.y, answer.text, { field: shown.field, band: shown.band, hdu: WHOLE_FIELD });
}

// The go-to box found the position: on another chip that chip opens, centred there; the mark goes on it.
function goTo(answer) {
  message.clear('goto');
  if (shown === null || field === null) return;
  if (isWholeField(shown.hdu)) {
    goToOnWholeField(answer);
    return;
  }
  const target = { field: shown.field, band: shown.band, hdu: answer.hdu };
  clearMark();
  if (answer.hdu !== shown.hdu) {
    const z = imageView.view?.z ?? null;
    const hdu = field.bands.find((b) => b.name === shown.band)?.hdus.find((h) => h.index === answer.hdu) ?? null;
    const view = z === null || hdu === null ? null : { x: answer.atX, y: answer.atY, z: imageView.centringZoom(answer.atX, answer.atY, z, hdu) };
    open(field, { band: shown.band, hdu: answer.hdu, view });
    if (shown.hdu !== answer.hdu) return;
  } else {
    imageView.centreOn(answer.atX, answer.atY);
  }
  placeMark(answer.atX, answer.atY, answer.text, target);
}

/** The same HDU index in another band, or null when that band has none. */
function hduOf(bandName, index, onField = field) {
  const band = onField.bands.find((b) => b.name === bandName);
  if (band === undefined) return null;
  return isWholeField(index) ? wholeFieldEntry(band) : band.hdus.find((h) => h.index === index) ?? null;
}

// Puts on screen what the state asks for: one image (a band or the composite), the three bands side by side, or
// two layers compared; and the colour and layout controls with it.
function render(view = null) {
  if (field === null || shown === null) return;
  const { colour, layout, display } = state.current;
  const colourMode = colour.rgb !== null;
  const channels = channelsOf(field, colour);
  const names = readableNames(field);
  const hdu = hduOf(shown.band, shown.hdu);
  const layers = compareLayers(field, colour, layout, channels);

  const asked = channelBands(colour, { red: null, green: null, blue: null });
  const unknown = CHANNELS.filter((channel) => asked[channel] !== null && !names.includes(asked[channel]));
  if (unknown.length > 0) {
    const which = unknown.map((channel) => `${channel} “${asked[channel]}” (showing ${channels[channel]})`).join(', ');
    message.show(`Not a band of field “${field.id}”: ${which}.`, 'channels');
  } else {
    message.clear('channels');
  }
  bandSelect.disabled = colourMode || names.length === 0;
  bandSelect.title = colourMode ? 'A colour composite shows the bands chosen for its channels in the display panel' : '';
  colourControls.show(colour, channels, lastResolvedColour(colour));
  layoutControls.show(layout, layers, { bands: names, composite: colourMode });
  showSectionsFor(colour.rgb);
  stage.dataset.view = layout.view ?? 'single';

  if (layout.view === 'panes') {
    const specs = CHANNELS.map((channel) => ({
      channel, band: channels[channel], hdu: hduOf(channels[channel], shown.hdu), palette: layout.panePalettes?.[CHANNELS.indexOf(channel)],
    }));
    const missing = specs.find((spec) => spec.hdu === null);
    if (missing) {
      message.show(`Band ${missing.band} has no HDU ${shown.hdu}: the side-by-side panes need the same chip in every band.`, 'layout');
      return;
    }
    message.clear('layout');
    panes.show(field.id, specs, display, view ?? (panes.visible ? null : imageView.view));
    imageView.setCompare(null);
    resolveComposite();
    return;
  }
  message.clear('layout');
  const start = view ?? (panes.visible ? panes.view : null);
  panes.hide();
  const comparing = layout.view === 'swipe' || layout.view === 'blink';
  const base = comparing ? layers.first : colourMode ? COMPOSITE_LAYER : shown.band;
  const baseUrl = layerUrl(base, shown.hdu);
  const wholeField = isWholeField(shown.hdu);
  const geometry = `${shown.hdu}:${hdu.width}x${hdu.height}x${hdu.maxZoom}`;
  if (shownGeometry !== geometry || start !== null) {
    imageView.show(imageSpec(baseUrl, hdu, wholeField), start);
    shownGeometry = geometry;
  } else {
    imageView.restyle(baseUrl);
  }
  imageView.setCompare(comparing ? {
    tileUrl: layerUrl(layers.second, shown.hdu),
    mode: layout.view,
    divider: layout.divider ?? LAYOUT_DEFAULTS.divider,
    interval: layout.blink ?? LAYOUT_DEFAULTS.blink,
    labels: { first: layerLabel(layers.first), second: layerLabel(layers.second) },
  } : null);
  const readBand = base === COMPOSITE_LAYER ? shown.band : base;
  readout.setSource({
    field: field.id, band: readBand, hdu: shown.hdu, hduName: hdu.name, width: hdu.width, height: hdu.height,
    sky: hdu.sky ?? null, skyError: hdu.skyError ?? null, wholeField,
    channels: base === COMPOSITE_LAYER ? CHANNELS.map((channel) => ({ channel, band: channels[channel] })) : undefined,
  });
  resolveComposite();
}

// What the image view needs to show one HDU: on the whole field the masked colour stays inside the chips.
function imageSpec(tileUrl, hdu, wholeField) {
  const maskShapes = wholeField ? hdu.chips.map((chip) => chip.outline) : null;
  return { tileUrl, width: hdu.width, height: hdu.height, maxZoom: hdu.maxZoom, maskShapes };
}

// The picture open() will show, put up first so that its tiles are asked for before the pickers, panels and
// overlays are filled in; open() then finds it on screen and keeps it. One image only: panes and comparisons wait.
function showFirstImage(candidate, wanted, view) {
  if (['panes', 'swipe', 'blink'].includes(wanted.layout.view)) return false;
  const source = landingSource(candidate, wanted);
  const hdu = source === null ? null : hduOf(source.band, source.hdu, candidate);
  if (hdu === null) return false;
  const token = wanted.colour.rgb !== null ? COMPOSITE_LAYER : source.band;
  imageView.showEarly(imageSpec(layerUrl(token, source.hdu, candidate), hdu, isWholeField(source.hdu)), view);
  return true;
}

// A task boundary, so the browser sends the image requests made so far before the next script runs (a message, not
// a timer: timers are slowed down in a tab opened in the background).
function nextTask() {
  const channel = new MessageChannel();
  return new Promise((resolve) => {
    channel.port1.onmessage = () => {
      channel.port1.close();
      resolve();
    };
    channel.port2.postMessage(null);
  });
}

// The server's resolved composite for the settings now in use, kept for the colour controls.
let resolvedColour = null;

function lastResolvedColour(colour) {
  return resolvedColour !== null && resolvedColour.for === colourKey(colour) ? resolvedColour.value : null;
}

function colourKey(colour) {
  return JSON.stringify([field?.id, shown?.hdu, colour, colour.rgb === 'each' ? state.current.display : null]);
}

async function resolveComposite() {
  const { colour, display } = state.current;
  if (colour.rgb === null || field === null) {
    compositeRequest?.abort();
    message.clear('colour');
    return;
  }
  const key = colourKey(colour);
  if (resolvedColour?.for === key) return;
  compositeRequest?.abort();
  const request = new AbortController();
  compositeRequest = request;
  const channels = channelsOf(field, colour);
  try {
    const dto = await getCompositeDisplay({ field: field.id, hdu: shown.hdu }, display, { ...colour, ...channels }, request.signal);
    if (request.signal.aborted) return;
    resolvedColour = { for: key, value: readResolvedColour(dto) };
    message.clear('colour');
    colourControls.show(state.current.colour, channelsOf(field, state.current.colour), lastResolvedColour(state.current.colour));
  } catch (error) {
    if (error?.name === 'AbortError' || request.signal.aborted) return;
    message.show(`This colour composite cannot be drawn: ${error.detail || error.message}`, 'colour');
  }
}

// Which parts of the display panel apply: Lupton's composite has its own tone curve and limits, and no composite
// takes a palette.
function showSectionsFor(rgb) {
  const root = panelRoot;
  setSectionActive(root.querySelector('[data-role=limits-section]'), rgb !== 'lupton');
  setSectionActive(root.querySelector('[data-role=stretch-section]'), rgb !== 'lupton');
  setSectionActive(root.querySelector('[data-role=colour-bar-section]'), rgb === null);
  const note = root.querySelector('[data-role=palette-inactive]');
  setSectionActive(root.querySelector('[data-role=palette-list]'), rgb === null, note);
  setSectionActive(root.querySelector('[data-role=cubehelix]'), rgb === null);
}

// Each palette's own masked colour (from /api/palettes): a colour none of its values can pass for. Used while
// the URL names none, so a colourful palette never shares its masked colour with one of its own steps.
const paletteMasks = new Map();

function paintMask(display) {
  const root = document.documentElement.style;
  // Any colour can be a composite's: it keeps the page's own masked colour.
  const own = state.current.colour.rgb !== null ? defaultMask : paletteMasks.get(display.palette ?? 'gray') ?? defaultMask;
  panel.palette.setDefaultMask(own);
  root.setProperty('--mask-colour', `#${display.masked ?? own}`);
}

// New display settings: the URL, the tiles (only if what they show changed) and the panel follow.
function applyDisplay(next) {
  const before = state.current.display;
  state.update({ display: next });
  paintMask(next);
  if (shown === null) {
    panel.show(next, null);
    return;
  }
  const source = { field: shown.field, band: shown.band, hdu: shown.hdu };
  if (sameDisplay({ ...before, masked: null }, { ...next, masked: null })) {
    panel.show(next, panel.resolved);
    return;
  }
  render();
  sync.update(source, next);
}

// New colour settings: a change of mode or of the red channel's band reopens the field (the chip picker lists the
// red band's chips); anything else redraws.
function applyColour(next) {
  const before = state.current.colour;
  if (sameColour(before, next)) return;
  state.update({ colour: next });
  paintMask(state.current.display);
  if (field === null) return;
  const reopen = (before.rgb === null) !== (next.rgb === null) || channelsOf(field, before).red !== channelsOf(field, next).red;
  if (reopen) open(field, { band: state.current.band, hdu: shown?.hdu ?? null });
  else render();
}

function applyLayout(next) {
  state.update({ layout: next });
  render();
}

async function fitLimitsToView() {
  try {
    const next = await sync.fitToBox(imageView.visibleBox);
    if (next === null) {
      message.show('No part of the image is on screen to take the limits from.', 'display');
      return;
    }
    message.clear('display');
    applyDisplay(next);
  } catch (error) {
    message.show(`The limits could not be taken from the screen: ${error.message}`, 'display');
  }
}

async function loadPalettes() {
  try {
    const palettes = await listPalettes();
    for (const palette of palettes) {
      if (typeof palette.defaultMasked === 'string') paletteMasks.set(palette.name, palette.defaultMasked.replace('#', '').toLowerCase());
    }
    panel.palette.setPalettes(palettes);
    panes.setPalettes(palettes);
    showSectionsFor(state.current.colour.rgb);
    paintMask(state.current.display);
  } catch (error) {
    panel.palette.showUnavailable(`The palettes could not be listed: ${error.message}`);
  }
}

function watchPreparation(band) {
  if (!bandEntries(band).some(isPreparing)) {
    watcher.stop();
    return;
  }
  watcher.watch(field.id, {
    onField: onFieldPolled,
    onError: (error) => message.show(`Cannot reach the server (${error.message}); trying again.`, 'connection'),
    isDone: (polled) => {
      const band = polled.bands.find((b) => b.name === shown?.band);
      return !(band && bandEntries(band).some(isPreparing));
    },
  });
}

function onFieldPolled(polled) {
  message.clear('connection');
  if (shown === null || polled.id !== shown.field) return;
  field = polled;
  fields = fields.map((known) => (known.id === polled.id ? polled : known));
  const band = polled.bands.find((b) => b.name === shown.band);
  const hdu = band ? bandEntries(band).find((h) => h.index === shown.hdu) : undefined;
  if (!band || !hdu) return;
  hduPicker.setHdus(bandEntries(band), hdu.index);
  progress.show(hdu.name, hdu.pyramid);
  const ready = hdu.pyramid?.state === 'ready';
  if (ready && !shown.ready) imageView.refreshTiles();
  shown.ready = ready;
}

async function switchField(id) {
  watcher.stop();
  try {
    const fresh = await getField(id);
    fields = fields.map((known) => (known.id === id ? fresh : known));
    if (fresh.error) {
      message.show(`Field “${id}” cannot be shown: ${fresh.error}`);
      fieldPicker.setFields(fields, field?.id ?? null);
      return;
    }
    message.clear();
    // Another field has other bands: its channels and compared layers start from its own defaults.
    if (fresh.id !== field?.id) {
      const { colour, layout } = state.current;
      state.update({
        colour: { ...colour, red: null, green: null, blue: null, channels: undefined },
        layout: { ...layout, first: null, second: null },
      });
    }
    open(fresh);
  } catch (error) {
    message.show(`Field “${id}” could not be loaded: ${error.message}`);
  }
}

function wireEvents() {
  fieldPicker.addEventListener('pick', (event) => switchField(event.detail));
  // A pick answers whatever the message line said about an earlier choice.
  bandPicker.addEventListener('pick', (event) => {
    message.clear();
    if (field) open(field, { band: event.detail, hdu: shown?.hdu ?? null });
  });
  hduPicker.addEventListener('pick', (event) => {
    message.clear();
    if (field) open(field, { band: shown?.band ?? null, hdu: event.detail });
  });
  imageView.addEventListener('viewchange', (event) => {
    state.update(event.detail);
    refreshSky();
  });
  gotoBox.addEventListener('found', (event) => goTo(event.detail));
  gotoBox.addEventListener('failed', (event) => message.show(`Go to: ${event.detail.detail || event.detail.message}`, 'goto'));
  gotoBox.addEventListener('clear', () => {
    clearMark();
    message.clear('goto');
  });
  gridToggle.addEventListener('toggle', (event) => setGrid(event.detail));
  outlineToggle.addEventListener('toggle', (event) => setOutlines(event.detail));
  exportPanel.addEventListener('saved', () => message.clear('picture'));
  exportPanel.addEventListener('failed', (event) => message.show(`Export: ${event.detail.detail || event.detail.message}`, 'picture'));
  skySync.addEventListener('sky', (event) => onSky(event.detail));
  skySync.addEventListener('clear', (event) => onSkyCleared(event.detail));
  imageView.addEventListener('pointer', (event) => readout.pointAt(event.detail));
  panel.addEventListener('change', (event) => applyDisplay(event.detail));
  panel.addEventListener('fit-view', () => fitLimitsToView());
  colourControls.addEventListener('change', (event) => {
    message.clear('colour');
    applyColour(event.detail);
  });
  layoutControls.addEventListener('change', (event) => applyLayout(event.detail));
  imageView.addEventListener('divider', (event) => state.update({ layout: { ...state.current.layout, divider: event.detail } }));
  panes.addEventListener('viewchange', (event) => state.update(event.detail));
  panes.addEventListener('palette', (event) => {
    const palettes = CHANNELS.map((channel, i) => state.current.layout.panePalettes?.[i] ?? 'gray');
    palettes[CHANNELS.indexOf(event.detail.channel)] = event.detail.palette;
    applyLayout({ ...state.current.layout, panePalettes: palettes });
  });
}

// The band and HDU open() shows for what the state asks: a colour composite shows its red channel's chips.
function landingSource(candidate, wanted) {
  const band = wanted.colour.rgb !== null ? readableBand(candidate, channelsOf(candidate, wanted.colour).red) : pickBand(candidate, wanted.band);
  return band === null ? null : { field: candidate.id, band: band.name, hdu: pickHdu(band, wanted.hdu, candidate.defaultHdu).index };
}

// A version 1 link's centre, named on the sky, found on the HDU it will be shown on; null (the default view) where
// it is not on that HDU.
async function skyLinkView(candidate, wanted, sky) {
  const source = landingSource(candidate, wanted);
  if (source === null) return null;
  try {
    return await viewLink.land(source, sky, wanted.z);
  } catch (error) {
    message.show(`The link's centre (RA ${sky.ra}°, Dec ${sky.dec}°) could not be found on what it opens: ${error.detail || error.message} Showing the default view instead.`, 'link');
    return null;
  }
}

// A whole view from elsewhere (a meeting's presenter), applied in place: what differs is opened or redrawn, and the
// centre and zoom are gone to at once.
async function showView(next) {
  const now = state.current;
  const view = next.x !== null && next.y !== null && next.z !== null ? { x: next.x, y: next.y, z: next.z } : null;
  if (next.grid !== now.grid) setGrid(next.grid);
  if (next.outlines !== now.outlines) setOutlines(next.outlines);
  state.update({ markers: next.markers });
  let candidate = field;
  if (next.field !== null && next.field !== field?.id) {
    candidate = await getField(next.field);
    fields = fields.map((known) => (known.id === candidate.id ? candidate : known));
  }
  if (candidate === null) return;
  if (candidate !== field || next.band !== now.band || next.hdu !== now.hdu || !sameColour(now.colour, next.colour)) {
    state.update({ band: next.band, hdu: next.hdu, display: next.display, colour: next.colour, layout: next.layout });
    paintMask(next.display);
    open(candidate, { band: next.band, hdu: next.hdu, view });
    return;
  }
  if (!sameLayout(now.layout, next.layout)) applyLayout(next.layout);
  if (!sameDisplay(now.display, next.display)) applyDisplay(next.display);
  if (view === null) return;
  if (panes.visible) render(view);
  else imageView.follow(view);
}

async function start() {
  wireEvents();
  setGrid(state.current.grid);
  setOutlines(state.current.outlines);
  panel.limits.fitEnabled = false;
  panel.show(state.current.display, null);
  paintMask(state.current.display);
  const dropped = opening.version === null ? [] : droppedParameters(location.search, state.current.display);
  if (dropped.length > 0) {
    message.show(`Left out of the link's display settings (out of range, or not used with the others): ${dropped.join(', ')}.`, 'link');
  }
  loadPalettes();
  try {
    fields = await listFields();
  } catch (error) {
    message.show(`The list of fields could not be loaded: ${error.message}`);
    return;
  }
  const wanted = state.current;
  const readable = fields.filter((candidate) => !candidate.error);
  if (readable.length === 0) {
    fieldPicker.setFields(fields, null);
    message.show(fields.length === 0 ? 'The data folder holds no FITS files.' : 'No field in the data folder can be read.');
    return;
  }
  let chosen = readable.find((candidate) => candidate.id === wanted.field) ?? null;
  if (wanted.field !== null && chosen === null) {
    message.show(`Field “${wanted.field}” is not available; showing “${readable[0].id}” instead.`);
  }
  if (opening.problem !== null) message.show(opening.problem, 'link');
  let view = chosen !== null && wanted.x !== null && wanted.y !== null && wanted.z !== null
    ? { x: wanted.x, y: wanted.y, z: wanted.z }
    : null;
  if (chosen !== null && opening.sky !== null && wanted.z !== null) view = await skyLinkView(chosen, wanted, opening.sky);
  chosen ??= readable[0];
  if (showFirstImage(chosen, wanted, view)) await nextTask();
  open(chosen, { band: wanted.band, hdu: wanted.hdu, view });
  meeting.start();
}

start();
