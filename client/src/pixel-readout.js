// Shows the pixel under the pointer: its 1-based FITS x and y, at once, and its value and sky position, asked from
// the server with at most one request in flight; a request made stale by a newer position or another HDU is dropped
// or ignored.
import { probePixel } from './api.js';
import { SkyReadout } from './sky-readout.js';
import { containingPixel } from './pixel-crs.js';
import { formatPixelValue } from './value-format.js';

// Between probe requests; the pixel numbers themselves follow the pointer at once.
const MIN_INTERVAL_MS = 40;

export class PixelReadout {
  #hduLabel;
  #xLabel;
  #yLabel;
  #valueLabel;
  #sky;
  #probe;
  #source = null;
  // The pixel shown now, and the request for it not yet sent.
  #current = null;
  #pending = null;
  #inFlight = null;
  #timer = null;
  #lastSent = -Infinity;
  #sequence = 0;

  constructor(element, probe = probePixel) {
    this.#hduLabel = element.querySelector('[data-role="hdu"]');
    this.#xLabel = element.querySelector('[data-role="x"]');
    this.#yLabel = element.querySelector('[data-role="y"]');
    this.#valueLabel = element.querySelector('[data-role="value"]');
    // The side-by-side panes' small readouts have no sky row.
    const skyRow = element.querySelector('[data-role="sky"]');
    this.#sky = skyRow === null ? null : new SkyReadout(skyRow);
    this.#probe = probe;
  }

  /** The HDU being viewed: {field, band, hdu, hduName, width, height, sky, skyError} (sky null: no celestial WCS), and `channels` for a composite's bands. */
  setSource(source) {
    this.#forget();
    this.#source = source;
    this.#sky?.setSource(source.sky ?? null, source.skyError ?? null);
    this.#hduLabel.textContent = source.hduName;
    this.#hduLabel.title = `${source.field} · ${source.band} · HDU ${source.hdu}`;
    this.#showNothing();
  }

  /** The pointer is over FITS position `at` ({x, y}), or off the image view when `at` is null. */
  pointAt(at) {
    if (this.#source === null) return;
    if (at === null) {
      this.#forget();
      this.#showNothing();
      return;
    }
    const px = containingPixel(at.x);
    const py = containingPixel(at.y);
    if (this.#current?.px === px && this.#current?.py === py) {
      // Same pixel, so the same value; the sky position follows the pointer within it (zoomed past native).
      if (this.#current.inside) {
        this.#pending = { source: this.#source, x: at.x, y: at.y, sequence: this.#sequence };
        this.#schedule();
      }
      return;
    }
    this.#forget();
    const inside = px >= 1 && py >= 1 && px <= this.#source.width && py <= this.#source.height;
    this.#current = { px, py, inside };
    this.#showPixel(px, py);
    if (!inside) {
      this.#showValue('outside the image', 'outside');
      this.#sky?.showNothing();
      return;
    }
    this.#showValue('…', 'pending');
    this.#sky?.showPending();
    this.#pending = { source: this.#source, x: at.x, y: at.y, sequence: this.#sequence };
    this.#schedule();
  }

  #schedule() {
    if (this.#inFlight !== null || this.#timer !== null || this.#pending === null) return;
    const wait = Math.max(0, this.#lastSent + MIN_INTERVAL_MS - performance.now());
    this.#timer = setTimeout(() => {
      this.#timer = null;
      this.#send();
    }, wait);
  }

  async #send() {
    const request = this.#pending;
    this.#pending = null;
    if (request === null) return;
    const controller = new AbortController();
    this.#inFlight = controller;
    this.#lastSent = performance.now();
    try {
      const answer = await this.#probe(request.source, request.x, request.y, controller.signal);
      // A value is shown only beside the pixel it belongs to.
      if (request.sequence === this.#sequence) this.#showAnswer(answer);
    } catch (error) {
      if (!controller.signal.aborted && request.sequence === this.#sequence) {
        this.#showValue(`no value: ${error.detail || error.message}`, 'error');
        this.#sky?.showNothing();
      }
    } finally {
      if (this.#inFlight === controller) this.#inFlight = null;
      this.#schedule();
    }
  }

  /** Drops the shown pixel and any request for it; answers still on their way are then ignored. */
  #forget() {
    this.#sequence += 1;
    this.#current = null;
    this.#pending = null;
    clearTimeout(this.#timer);
    this.#timer = null;
    this.#inFlight?.abort();
    this.#inFlight = null;
  }

  #showAnswer(answer) {
    this.#showPixel(answer.x, answer.y);
    this.#sky?.showAnswer(answer);
    if (answer.channels) {
      // A composite: every band's value, masked where that band is.
      const text = answer.channels.map((c) => `${c.short} ${c.value === null ? 'masked' : formatPixelValue(c.value)}`).join(' · ');
      const masked = answer.channels.some((c) => c.value === null);
      this.#showValue(text, masked ? 'masked' : 'value', masked ? null : answer.channels[0].value);
      this.#valueLabel.dataset.values = answer.channels.map((c) => (c.value === null ? '' : String(c.value))).join(',');
      return;
    }
    if (answer.value === null || answer.value === undefined) {
      this.#showValue('masked', 'masked');
    } else {
      const unit = answer.bunit ? ` ${answer.bunit}` : '';
      this.#showValue(`${formatPixelValue(answer.value)}${unit}`, 'value', answer.value);
    }
  }

  #showNothing() {
    this.#showPixel(null, null);
    this.#sky?.showNothing();
    this.#showValue('–', 'none');
  }

  #showPixel(px, py) {
    this.#xLabel.textContent = px === null ? '–' : String(px);
    this.#yLabel.textContent = py === null ? '–' : String(py);
  }

  #showValue(text, kind, value = null) {
    this.#valueLabel.textContent = text;
    delete this.#valueLabel.dataset.values;
    this.#valueLabel.dataset.kind = kind;
    if (value === null) delete this.#valueLabel.dataset.value;
    else this.#valueLabel.dataset.value = String(value);
  }
}
