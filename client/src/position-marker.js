// The mark the go-to box leaves on the image: a ring with four ticks around the position, leaving the pixel itself
// in view, plus the text typed as a label. A Leaflet layer in the pixel CRS, so it stays on its pixel at every zoom.
import { Marker, DivIcon } from 'leaflet';

// Screen pixels: the ring is this wide, its centre on the position.
const SIZE = 34;

/** A mark at FITS position (x, y), labelled `label`. */
export function createPositionMarker(x, y, label) {
  const icon = new DivIcon({
    className: 'goto-marker',
    iconSize: [SIZE, SIZE],
    iconAnchor: [SIZE / 2, SIZE / 2],
    html: '<span class="goto-marker-ring"></span><span class="goto-marker-label"></span>',
  });
  const marker = new Marker([y, x], { icon, interactive: false, keyboard: false, zIndexOffset: 1000 });
  marker.on('add', () => {
    const element = marker.getElement();
    element.querySelector('.goto-marker-label').textContent = label;
    element.dataset.x = String(x);
    element.dataset.y = String(y);
  });
  return marker;
}
