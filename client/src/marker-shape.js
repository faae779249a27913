// A marker's outline in FITS pixels of the image it is drawn on. On the sky, sizes are arcsec along east (width)
// and north (height) as the /sky endpoint gives them at the marker's own position (unit vectors in pixel axes and
// arcsec per pixel): over a region a few arcminutes across the sky is flat to well under a pixel (common practice),
// so offsets from the centre are linear in those two vectors, and a skewed or flipped WCS tilts or mirrors the shape
// as it should. In pixels, width runs along x and height along y.

// Enough vertices that a circle of a few hundred screen pixels shows no corners.
const CIRCLE_STEPS = 96;

/**
 * The two axes of a marker's sizes in pixels per unit of size: `local` ({north, east, pixelScale}) for a marker on
 * the sky, ignored for one in pixels. Null when the sky answer cannot size it.
 */
export function markerAxes(marker, local) {
  if (!marker.sky) return { u: { dx: 1, dy: 0 }, v: { dx: 0, dy: 1 } };
  const { north, east, pixelScale } = local ?? {};
  if (!isVector(north) || !isVector(east) || !(pixelScale > 0)) return null;
  const unit = (vector) => {
    const length = Math.hypot(vector.dx, vector.dy);
    return { dx: vector.dx / length / pixelScale, dy: vector.dy / length / pixelScale };
  };
  return { u: unit(east), v: unit(north) };
}

/** The outline ([[x, y], ...], FITS pixels, closed by the first point) of a circle or box at (x, y); [] for a point. */
export function markerOutline(marker, x, y, axes) {
  const at = (a, b) => [x + a * axes.u.dx + b * axes.v.dx, y + a * axes.u.dy + b * axes.v.dy];
  if (marker.kind === 'circle') {
    const points = [];
    for (let i = 0; i < CIRCLE_STEPS; i += 1) {
      const angle = (2 * Math.PI * i) / CIRCLE_STEPS;
      points.push(at(marker.radius * Math.cos(angle), marker.radius * Math.sin(angle)));
    }
    return points;
  }
  if (marker.kind === 'box') {
    const [w, h] = [marker.width / 2, marker.height / 2];
    return [at(-w, -h), at(w, -h), at(w, h), at(-w, h)];
  }
  return [];
}

function isVector(vector) {
  return vector !== null && vector !== undefined && Number.isFinite(vector.dx) && Number.isFinite(vector.dy)
    && Math.hypot(vector.dx, vector.dy) > 0;
}
