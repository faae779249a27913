// The scale bar: a bar of a round angular length (1″ 2″ 5″ 10″ 20″ 30″ 1′ ... 1° 2° 5° ...) between ~60 and ~150
// screen pixels at the current zoom, labelled with that length.
import { formatAngle } from './sky-format.js';

// Arcseconds. Consecutive lengths differ by at most 2.5 times, and 150 / 60 = 2.5, so one always fits the range.
const LENGTHS = [
  0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 30,
  60, 120, 300, 600, 1200, 1800,
  3600, 7200, 18000, 36000, 72000, 108000, 216000, 324000,
];
const MIN_PIXELS = 60;
const MAX_PIXELS = 150;

/** The round length (arcsec) whose bar is 60-150 screen (or picture) pixels long at `arcsecPerPixel`; null if none is. */
export function chooseLength(arcsecPerPixel) {
  if (!(arcsecPerPixel > 0) || !Number.isFinite(arcsecPerPixel)) return null;
  return LENGTHS.find((length) => length / arcsecPerPixel >= MIN_PIXELS && length / arcsecPerPixel <= MAX_PIXELS) ?? null;
}

export class ScaleBar {
  #element;
  #bar;
  #label;

  constructor(element) {
    this.#element = element;
    this.#bar = element.querySelector('[data-role="bar"]');
    this.#label = element.querySelector('[data-role="label"]');
    this.hide();
  }

  /** `pixelScale` in arcsec per image pixel, `scale` screen pixels per image pixel. */
  show(pixelScale, scale) {
    const arcsecPerPixel = pixelScale / scale;
    const length = chooseLength(arcsecPerPixel);
    if (length === null) {
      this.hide();
      return;
    }
    const pixels = length / arcsecPerPixel;
    this.#bar.style.width = `${pixels.toFixed(2)}px`;
    this.#label.textContent = formatAngle(length);
    this.#element.dataset.arcsec = String(length);
    this.#element.dataset.pixels = pixels.toFixed(3);
    this.#element.hidden = false;
  }

  hide() {
    this.#element.hidden = true;
  }
}
