// Keeps the display panel in step with the server: the resolved display (limits, parameters, colour bar) for the
// settings in use, the band's histogram over a range that holds those limits, and limits taken from the screen.
import { getDisplay, getHistogram, getBandStats, getBoxStats } from './api.js';
import { normaliseDisplay } from './display-query.js';

const HISTOGRAM_BINS = 256;
// The drawn range reaches past both limits by this share of their distance, so each handle can move outwards.
const RANGE_MARGIN = 0.15;

function isAbort(error) {
  return error?.name === 'AbortError';
}

export class DisplaySync {
  #panel;
  #source = null;
  #display = null;
  #stats = null;
  #statsFor = null;
  #displayRequest = null;
  #histogramRequest = null;
  #histogramKey = null;

  constructor(panel) {
    this.#panel = panel;
  }

  /** The band and HDU on screen ({field, band, hdu}) and the settings in use changed: ask for what follows. */
  async update(source, display) {
    const bandKey = `${source.field}\u0000${source.band}`;
    const bandChanged = this.#statsFor !== bandKey;
    this.#source = source;
    this.#display = display;
    this.#panel.show(display, this.#panel.resolved !== null && !bandChanged ? this.#panel.resolved : null);
    if (bandChanged) {
      this.#statsFor = bandKey;
      this.#stats = null;
      this.#histogramKey = null;
      this.#panel.histogram.clear('Loading the histogram…');
      this.#loadStats(source, bandKey);
    }
    await this.#resolve(source, display);
  }

  /** Takes the limits from the pixels of `box` (FITS, 1-based, of the HDU on screen) and applies them everywhere. */
  async fitToBox(box) {
    const source = this.#source;
    if (source === null || box === null) return null;
    const stats = await getBoxStats(source, box);
    // The central 99 % of the pixels on screen: a few hot or dead pixels in view do not set the limits.
    let lo = stats.percentiles?.['0.5'];
    let hi = stats.percentiles?.['99.5'];
    if (!(lo < hi)) [lo, hi] = [stats.min, stats.max];
    if (!(Number.isFinite(lo) && Number.isFinite(hi) && lo < hi)) {
      throw new Error(stats.count > 0 ? 'every pixel on screen has the same value' : 'no unmasked pixel is on screen');
    }
    return normaliseDisplay({ ...this.#display, limits: 'value', lo, hi, plo: null, phi: null, klo: null, khi: null });
  }

  async #loadStats(source, bandKey) {
    try {
      const stats = await getBandStats(source);
      if (this.#statsFor !== bandKey) return;
      this.#stats = stats;
      this.#panel.stretch.setNoise(stats.madSigma, stats.max - stats.min);
      if (this.#panel.resolved !== null) this.#loadHistogram(this.#panel.resolved);
    } catch (error) {
      if (this.#statsFor !== bandKey) return;
      // The histogram can still be drawn around the limits alone.
      this.#stats = null;
      if (this.#panel.resolved !== null) this.#loadHistogram(this.#panel.resolved);
    }
  }

  async #resolve(source, display) {
    this.#displayRequest?.abort();
    const request = new AbortController();
    this.#displayRequest = request;
    try {
      const resolved = await getDisplay(source, display, request.signal);
      if (request.signal.aborted) return;
      this.#panel.setStatus(null);
      this.#panel.show(this.#display, resolved);
      this.#loadHistogram(resolved);
    } catch (error) {
      if (isAbort(error) || request.signal.aborted) return;
      this.#panel.setStatus(`The server could not resolve these settings: ${error.message}`);
    }
  }

  #rangeFor(resolved) {
    let low = resolved.lo;
    let high = resolved.hi;
    const p = this.#stats?.percentiles;
    if (p) {
      low = Math.min(low, p['0.1'] ?? low);
      high = Math.max(high, p['99.9'] ?? high);
    }
    const margin = (high - low) * RANGE_MARGIN;
    return { lo: low - margin, hi: high + margin };
  }

  async #loadHistogram(resolved) {
    const source = this.#source;
    if (source === null || this.#panel.histogram.dragging) return;
    const current = this.#panel.histogram.range;
    // Keep the drawn range while both limits are well inside it, so the handles move and the bars stay put.
    if (current !== null && this.#histogramKey === this.#statsFor) {
      const span = current.hi - current.lo;
      const inside = resolved.lo >= current.lo && resolved.hi <= current.hi;
      const useful = resolved.hi - resolved.lo > span / 50;
      if (inside && useful) return;
    }
    const range = this.#rangeFor(resolved);
    this.#histogramRequest?.abort();
    const request = new AbortController();
    this.#histogramRequest = request;
    try {
      const histogram = await getHistogram(source, { ...range, bins: HISTOGRAM_BINS }, request.signal);
      if (request.signal.aborted) return;
      this.#histogramKey = this.#statsFor;
      this.#panel.histogram.setData(histogram);
    } catch (error) {
      if (isAbort(error) || request.signal.aborted) return;
      this.#panel.histogram.clear(`No histogram: ${error.message}`);
    }
  }
}
