// Markers wired to the view state: the panel asks for a new list, the state (and so the URL, links, saved views and
// meetings) takes it, and the layer draws whatever list the state holds, however it got there.
import { MarkerLayer } from './marker-layer.js';
import { MarkerPanel } from './marker-panel.js';
import { droppedMarkers } from './marker-query.js';

const TOPIC = 'markers';

export class MarkerControls {
  #state;
  #layer;
  #panel;
  #drawn = null;

  /** `state` is the ViewState, `imageView` the ImageView, `message` the MessageLine. */
  constructor(state, imageView, message) {
    this.#state = state;
    const container = document.getElementById('image-view');
    this.#layer = new MarkerLayer(imageView, container);
    this.#panel = new MarkerPanel(document.getElementById('marker-panel'), document.getElementById('marker-toggle'), this.#layer);
    this.#panel.addEventListener('change', (event) => {
      message.clear(TOPIC);
      state.update({ markers: event.detail });
    });
    this.#panel.addEventListener('failed', (event) => message.show(`Markers: ${event.detail.detail || event.detail.message}`, TOPIC));
    this.#panel.addEventListener('centre', (event) => imageView.centreOn(event.detail.x, event.detail.y));
    this.#layer.addEventListener('placed', (event) => {
      container.dataset.markersPlaced = String(event.detail.length);
      this.#panel.show(state.current.markers, event.detail);
    });
    state.addEventListener('change', (event) => this.#sync(event.detail.markers));
    const dropped = droppedMarkers(location.search);
    if (dropped > 0) message.show(`Left out of the link: ${dropped} marker${dropped === 1 ? '' : 's'} that could not be read.`, TOPIC);
    this.#sync(state.current.markers);
  }

  /** The layer, for the picture export (its placements). */
  get layer() {
    return this.#layer;
  }

  /** The image shown ({field, band, hdu}) and whether it has a celestial WCS. */
  setSource(source, sky) {
    const next = source === null ? null : { field: source.field, band: source.band, hdu: source.hdu, sky };
    this.#panel.setSource(next);
    this.#layer.setSource(next);
  }

  #sync(markers) {
    if (markers === this.#drawn) return;
    this.#drawn = markers;
    // Until the layer has looked them up, the list shows without positions on this image.
    delete document.getElementById('image-view').dataset.markersPlaced;
    this.#panel.show(markers, []);
    this.#layer.show(markers);
  }
}
