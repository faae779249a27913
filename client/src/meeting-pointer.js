// The presenter's pointer as followers see it: a small filled arrowhead with a tag, a Leaflet layer in the pixel CRS
// so it sits on the presenter's image point at every zoom.
import { Marker, DivIcon } from 'leaflet';

const SIZE = 22;

/** A marker to move with `moveTo(x, y)` (FITS pixels, 1-based); add it to the image view as an overlay. */
export function createPresenterPointer(label = 'presenter') {
  const icon = new DivIcon({
    className: 'meeting-pointer',
    iconSize: [SIZE, SIZE],
    // The arrow's tip is the point.
    iconAnchor: [1, 1],
    html: '<svg viewBox="0 0 22 22" aria-hidden="true"><path d="M1 1 L19 9 L11 11 L9 19 Z" /></svg><span class="meeting-pointer-label"></span>',
  });
  const marker = new Marker([0, 0], { icon, interactive: false, keyboard: false, zIndexOffset: 2000 });
  marker.on('add', () => {
    marker.getElement().querySelector('.meeting-pointer-label').textContent = label;
    stamp(marker);
  });
  marker.moveTo = (x, y) => {
    marker.setLatLng([y, x]);
    stamp(marker);
  };
  return marker;
}

function stamp(marker) {
  const element = marker.getElement();
  if (!element) return;
  const at = marker.getLatLng();
  element.dataset.x = String(at.lng);
  element.dataset.y = String(at.lat);
}
