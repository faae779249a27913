// The compass in a corner of the image view: arrows towards north (increasing Dec) and east (increasing RA) as they
// lie on screen at the middle of the view. The server gives both as unit vectors in pixel axes (x right, y up); the
// screen's y runs down, so a vector (dx, dy) is drawn as (dx, -dy).
// Arrow length in the SVG's own units (its viewBox is 100 wide, centred on the arrows' common foot).
const LENGTH = 30;
const LABEL_AT = 41;

export class Compass {
  #element;
  #arrows;

  constructor(element) {
    this.#element = element;
    this.#arrows = {
      north: { line: element.querySelector('[data-role="north"]'), label: element.querySelector('[data-role="north-label"]') },
      east: { line: element.querySelector('[data-role="east"]'), label: element.querySelector('[data-role="east-label"]') },
    };
    this.hide();
  }

  /** `north` and `east` of a /sky answer ({dx, dy}, or null where the centre has no sky position). */
  show(north, east) {
    if (!isVector(north) || !isVector(east)) {
      this.hide();
      return;
    }
    this.#point(this.#arrows.north, north);
    this.#point(this.#arrows.east, east);
    this.#element.hidden = false;
  }

  hide() {
    this.#element.hidden = true;
  }

  #point({ line, label }, { dx, dy }) {
    const length = Math.hypot(dx, dy);
    const [sx, sy] = [dx / length, -dy / length];
    line.setAttribute('x2', (sx * LENGTH).toFixed(2));
    line.setAttribute('y2', (sy * LENGTH).toFixed(2));
    label.setAttribute('x', (sx * LABEL_AT).toFixed(2));
    label.setAttribute('y', (sy * LABEL_AT).toFixed(2));
  }
}

function isVector(vector) {
  return vector !== null && vector !== undefined && Number.isFinite(vector.dx) && Number.isFinite(vector.dy)
    && Math.hypot(vector.dx, vector.dy) > 0;
}

