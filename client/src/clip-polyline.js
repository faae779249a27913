// Cuts polylines to a rectangle (Liang–Barsky on each edge): the grid is drawn over the image only, though the
// server traces its lines a little past the box it was asked for.

/**
 * The parts of `points` ([[x, y], ...]) inside box {x0, y0, x1, y1}, as polylines of two or more points; a line
 * that leaves the box and comes back gives two parts.
 */
export function clipPolyline(points, box) {
  const parts = [];
  let current = null;
  for (let i = 1; i < points.length; i++) {
    const edge = clipSegment(points[i - 1], points[i], box);
    if (edge === null) {
      current = null;
      continue;
    }
    const [from, to, startsInside] = edge;
    if (current === null || !startsInside) {
      current = [from];
      parts.push(current);
    }
    current.push(to);
    // The edge left the box before its end: what follows starts a new part.
    if (to !== points[i]) current = null;
  }
  return parts.filter((part) => part.length >= 2);
}

// The piece of segment a-b inside the box, and whether it starts at a itself; null when none of it is inside.
function clipSegment(a, b, box) {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  let enter = 0;
  let leave = 1;
  const limits = [
    [-dx, a[0] - box.x0],
    [dx, box.x1 - a[0]],
    [-dy, a[1] - box.y0],
    [dy, box.y1 - a[1]],
  ];
  for (const [p, q] of limits) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const t = q / p;
    if (p < 0) enter = Math.max(enter, t);
    else leave = Math.min(leave, t);
    if (enter > leave) return null;
  }
  const at = (t) => [a[0] + t * dx, a[1] + t * dy];
  return [enter === 0 ? a : at(enter), leave === 1 ? b : at(leave), enter === 0];
}
