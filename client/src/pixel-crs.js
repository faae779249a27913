// Map coordinates are FITS image pixel coordinates: lng = x, lat = y, and FITS pixel i covers [i - 0.5, i + 0.5).
// At zoom = maxZoom one map unit is one screen pixel; each zoom level below halves that. The top-left corner of the
// tile grid is the image's corner (x = 0.5, y = height + 0.5), so the highest y (north) is at the top of the screen.
import { CRS, LatLngBounds, Transformation, Util } from 'leaflet';

/** A Leaflet CRS for an image `height` pixels tall whose native tile zoom is `maxZoom`. */
export function createPixelCrs(height, maxZoom) {
  if (!Number.isInteger(height) || height <= 0) throw new RangeError(`image height must be a positive integer, not ${height}`);
  if (!Number.isInteger(maxZoom) || maxZoom < 0) throw new RangeError(`maxZoom must be a non-negative integer, not ${maxZoom}`);
  return Util.extend({}, CRS.Simple, {
    code: 'mosaic-pixels',
    transformation: new Transformation(1, -0.5, -1, height + 0.5),
    scale: (zoom) => 2 ** (zoom - maxZoom),
    zoom: (scale) => Math.log2(scale) + maxZoom,
  });
}

/** The map area an image covers: from the outer edge of pixel (1, 1) to that of pixel (width, height). */
export function imageBounds(width, height) {
  return new LatLngBounds([0.5, 0.5], [height + 0.5, width + 0.5]);
}

/** The 1-based FITS pixel that contains a (fractional) FITS coordinate. */
export function containingPixel(coordinate) {
  return Math.floor(coordinate + 0.5);
}

/** The map position of FITS point [x, y], as the server gives outlines and grid lines: Leaflet wants [lat, lng]. */
export function toLatLng([x, y]) {
  return [y, x];
}
