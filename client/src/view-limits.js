// How far the view may wander off the image: the map keeps its centre where the view stays inside the image's
// bounds padded by half the image each way, so the image can be dragged half off screen, never lost.

/** The padding of the image's bounds, as a share of its size, inside which the view must stay. */
export const BOUNDS_PAD = 0.5;

// Zoom steps the map snaps to (its zoomSnap).
const ZOOM_STEP = 0.25;

/**
 * The lowest zoom, from `zoom` up in the map's steps and no higher than `maxZoom`, at which FITS position (x, y) of
 * an image of `width` x `height` pixels (native zoom `nativeZoom`) can be the middle of a `viewWidth` x
 * `viewHeight` view; `maxZoom` if none is.
 */
export function centringZoom({ width, height, nativeZoom, maxZoom }, { viewWidth, viewHeight }, x, y, zoom) {
  const left = 0.5 - BOUNDS_PAD * width;
  const right = width + 0.5 + BOUNDS_PAD * width;
  const bottom = 0.5 - BOUNDS_PAD * height;
  const top = height + 0.5 + BOUNDS_PAD * height;
  for (let z = zoom; z < maxZoom; z += ZOOM_STEP) {
    const scale = 2 ** (z - nativeZoom);
    const halfWidth = viewWidth / 2 / scale;
    const halfHeight = viewHeight / 2 / scale;
    if (x - halfWidth >= left && x + halfWidth <= right && y - halfHeight >= bottom && y + halfHeight <= top) return z;
  }
  return maxZoom;
}
