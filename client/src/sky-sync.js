// Asks the server what the coordinate grid, compass and scale bar need for the part of the image on screen, after
// every pan and zoom. The newest request wins: an older one is cancelled, and an answer to it is never shown.
import { getSky } from './api.js';

// The server draws at most this many screen pixels each way (its documented limit).
const MAX_SCREEN = 10000;

/**
 * Fires `sky` with {answer, scale} (the /sky answer and the screen pixels per image pixel it was asked for) and
 * `clear` when there is nothing to show: no celestial WCS, no image on screen, or the server could not answer
 * (then `detail` is the error).
 */
export class SkySync extends EventTarget {
  #fetchSky;
  #source = null;
  #inFlight = null;
  #sequence = 0;

  constructor(fetchSky = getSky) {
    super();
    this.#fetchSky = fetchSky;
  }

  /** The HDU shown ({field, band, hdu}) and whether it has a celestial WCS. */
  setSource(source, hasSky) {
    this.#cancel();
    this.#source = hasSky ? source : null;
    this.#emitClear(null);
  }

  /** The view now on screen, as ImageView.screen gives it. */
  async update(screen) {
    this.#cancel();
    if (this.#source === null || screen === null) return;
    const box = requestBox(screen);
    if (box === null) {
      this.#emitClear(null);
      return;
    }
    const sequence = this.#sequence;
    const controller = new AbortController();
    this.#inFlight = controller;
    try {
      const answer = await this.#fetchSky(this.#source, box, controller.signal);
      if (sequence === this.#sequence) this.dispatchEvent(new CustomEvent('sky', { detail: { answer, scale: screen.scale } }));
    } catch (error) {
      if (!controller.signal.aborted && sequence === this.#sequence) this.#emitClear(error);
    } finally {
      if (this.#inFlight === controller) this.#inFlight = null;
    }
  }

  #cancel() {
    this.#sequence += 1;
    this.#inFlight?.abort();
    this.#inFlight = null;
  }

  #emitClear(error) {
    this.dispatchEvent(new CustomEvent('clear', { detail: error }));
  }
}

/**
 * The part of the screen over the image (grid lines off the image would draw over nothing), with its size on
 * screen; null when no part of the image is on screen.
 */
function requestBox(screen) {
  const x0 = Math.max(screen.x0, 0.5);
  const x1 = Math.min(screen.x1, screen.imageWidth + 0.5);
  const y0 = Math.max(screen.y0, 0.5);
  const y1 = Math.min(screen.y1, screen.imageHeight + 0.5);
  if (!(x0 < x1 && y0 < y1)) return null;
  const pixels = (length) => Math.min(MAX_SCREEN, Math.max(1, Math.round(length * screen.scale)));
  return { x0: round(x0), y0: round(y0), x1: round(x1), y1: round(y1), width: pixels(x1 - x0), height: pixels(y1 - y0) };
}

// A thousandth of an image pixel: finer than any screen shows, and short in the URL.
function round(value) {
  return Math.round(value * 1000) / 1000;
}
