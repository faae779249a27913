// Shows the pixel under the pointer: its 1-based FITS x and y, at once, and its value and sky position, asked from
// the server with at most one request in flight; a request made stale by a newer position or another HDU is dropped
// or ignored. On the whole field the answer names the original chip under the point, its own pixel and its original
// value (never the resampled one), or says the point is in a gap between chips; the field's own pixel shows beside.
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
  #canvasPair;
  #canvasX;
  #canvasY;
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
    this.#canvasPair = element.querySelector('[data-role="canvas"]');
    this.#canvasX = element.querySelector('[data-role="canvas-x"]');
    this.#canvasY = element.querySelector('[data-role="canvas-y"]');
    // The side-by-side panes' small readouts have no sky row and no whole-field pixel.
    const skyRow = element.querySelector('[data-role="sky"]');
    this.#sky = skyRow === null ? null : new SkyReadout(skyRow);
    this.#probe = probe;
  }

  /**
   * The HDU being viewed: {field, band, hdu, hduName, width, height, sky, skyError, wholeField} (sky null: no
   * celestial WCS; wholeField true: hdu is the band's canvas), and `channels` for a composite's bands.
   */
  setSource(source) {
    this.#forget();
    this.#source = source;
    this.#sky?.setSource(source.sky ?? null, source.skyError ?? null);
    if (this.#canvasPair !== null) this.#canvasPair.hidden = !source.wholeField;
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
    if (this.#source.wholeField) {
      // The chip's own pixel comes with the answer; until then the last one stays, dimmed.
      this.#showCanvasPixel(px, py);
      this.#hduLabel.dataset.stale = 'true';
    } else {
      this.#showPixel(px, py);
    }
    if (!inside) {
      if (this.#source.wholeField) {
        this.#showChip(null);
        this.#showPixel(null, null);
      }
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
    if (this.#source.wholeField) {
      this.#showWholeFieldAnswer(answer);
      return;
    }
    this.#showPixel(answer.x, answer.y);
    this.#sky?.showAnswer(answer);
    this.#showMeasured(answer);
  }

  // The sky readout's exact point is the one on the image viewed (the canvas); the chip's own is on the chip label.
  #showWholeFieldAnswer(answer) {
    const onChip = answer.hdu !== null && answer.hdu !== undefined;
    this.#sky?.showAnswer({ ...answer, atX: answer.canvas?.x ?? null, atY: answer.canvas?.y ?? null });
    this.#showChip(onChip ? answer : null, !onChip);
    if (!onChip) {
      this.#showPixel(null, null);
      this.#showValue('no chip here', 'gap');
      return;
    }
    this.#showPixel(answer.x, answer.y);
    this.#showMeasured(answer);
  }

  #showMeasured(answer) {
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
    this.#showChip(null);
    this.#showCanvasPixel(null, null);
    this.#showPixel(null, null);
    this.#sky?.showNothing();
    this.#showValue('–', 'none');
  }

  /**
   * The HDU label: the chip under the point on the whole field ({hdu, hduName, atX, atY} of a probe answer), "gap"
   * between chips, else the name of the HDU viewed.
   */
  #showChip(chip, gap = false) {
    const label = this.#hduLabel;
    const source = this.#source;
    delete label.dataset.stale;
    delete label.dataset.atX;
    delete label.dataset.atY;
    label.dataset.kind = gap ? 'gap' : chip === null ? 'source' : 'chip';
    if (chip !== null) {
      label.textContent = chip.hduName;
      label.title = `${source.field} · ${source.band} · HDU ${chip.hdu}, on the whole field`;
      label.dataset.atX = String(chip.atX ?? '');
      label.dataset.atY = String(chip.atY ?? '');
    } else if (gap) {
      label.textContent = 'gap';
      label.title = 'Between the chips of the whole field: no chip took light here';
    } else {
      label.textContent = source?.hduName ?? '–';
      label.title = source === null ? '' : `${source.field} · ${source.band} · ${source.wholeField ? 'all chips' : `HDU ${source.hdu}`}`;
    }
  }

  #showCanvasPixel(px, py) {
    if (this.#canvasX === null || this.#canvasY === null) return;
    this.#canvasX.textContent = px === null ? '–' : String(px);
    this.#canvasY.textContent = py === null ? '–' : String(py);
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
