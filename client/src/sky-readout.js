// The sky part of the pixel readout: RA and Dec (sexagesimal and decimal degrees, ICRS) and Galactic l and b of
// the point probed, or "no WCS" with the reason when the HDU has no usable celestial WCS.
import { formatDegrees } from './sky-format.js';

const ROLES = ['ra', 'ra-deg', 'dec', 'dec-deg', 'l', 'b'];

export class SkyReadout {
  #element;
  #fields;
  #reason;
  #hasSky = false;

  constructor(element) {
    this.#element = element;
    this.#fields = Object.fromEntries(ROLES.map((role) => [role, element.querySelector(`[data-role="${role}"]`)]));
    this.#reason = element.querySelector('[data-role="no-wcs"]');
  }

  /** The HDU's `sky` (null when it has no celestial WCS) and `skyError` from the field list. */
  setSource(sky, skyError) {
    this.#hasSky = sky !== null && sky !== undefined;
    this.#reason.title = this.#hasSky ? '' : skyError || 'The header describes no celestial coordinate system.';
    this.showNothing();
  }

  showNothing() {
    this.#fill(null, this.#hasSky ? 'none' : 'no-wcs');
  }

  showPending() {
    if (this.#hasSky) this.#fill(null, 'pending');
  }

  /** A probe answer: ra, dec, raSexagesimal, decSexagesimal, l, b (null where the point has no sky position). */
  showAnswer(answer) {
    if (!this.#hasSky) {
      this.showNothing();
      return;
    }
    const known = Number.isFinite(answer.ra) && Number.isFinite(answer.dec);
    this.#fill(known ? answer : null, known ? 'sky' : 'no-position');
    this.#element.dataset.atX = String(answer.atX ?? '');
    this.#element.dataset.atY = String(answer.atY ?? '');
  }

  #fill(answer, kind) {
    this.#element.dataset.kind = kind;
    delete this.#element.dataset.atX;
    delete this.#element.dataset.atY;
    const text = {
      ra: answer?.raSexagesimal ?? '–',
      'ra-deg': answer ? formatDegrees(answer.ra) : '–',
      dec: answer?.decSexagesimal ?? '–',
      'dec-deg': answer ? formatDegrees(answer.dec, { signed: true }) : '–',
      l: answer && Number.isFinite(answer.l) ? formatDegrees(answer.l) : '–',
      b: answer && Number.isFinite(answer.b) ? formatDegrees(answer.b, { signed: true }) : '–',
    };
    for (const role of ROLES) this.#fields[role].textContent = text[role];
  }
}
