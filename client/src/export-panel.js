// The picture panel: screen or native resolution, which overlays to draw in, and the button that saves the PNG; and
// the FITS cutout of the same visible box.
import { ExportError, nativePicture, screenPicture } from './export-png.js';
import { getCutout, getSky } from './api.js';
import { isWholeField } from './whole-field.js';
import { downloadBlob } from './download.js';

/**
 * Fires `saved` ({name, width, height, resolution}) once a picture was handed to the browser, and `failed` with the
 * error when it could not be made.
 */
export class ExportPanel extends EventTarget {
  #root;
  #toggle;
  #container;
  #imageView;
  #markerLayer;
  #state;
  #saveButton;
  #cutoutButton;
  #busy = false;

  /**
   * `root` holds the panel's markup (index.html), `toggle` opens it, `container` is the image view's element; the
   * ImageView, the MarkerLayer and the ViewState say what is shown.
   */
  constructor(root, toggle, container, { imageView, markerLayer, state }) {
    super();
    this.#root = root;
    this.#toggle = toggle;
    this.#container = container;
    this.#imageView = imageView;
    this.#markerLayer = markerLayer;
    this.#state = state;
    this.#saveButton = root.querySelector('[data-role=save]');
    toggle.addEventListener('click', () => this.open = root.hidden);
    this.#cutoutButton = root.querySelector('[data-role=cutout]');
    this.#saveButton.addEventListener('click', () => this.save());
    this.#cutoutButton.addEventListener('click', () => this.saveCutout());
    root.addEventListener('keydown', (event) => {
      if (event.key === 'Escape') this.open = false;
    });
  }

  set open(on) {
    this.#root.hidden = !on;
    this.#toggle.setAttribute('aria-expanded', String(on));
  }

  #option(role) {
    return this.#root.querySelector(`[data-role=${role}]`).checked;
  }

  /** Makes the picture the panel describes and downloads it. */
  async save() {
    if (this.#busy) return;
    const native = this.#root.querySelector('input[name=export-resolution]:checked')?.value === 'native';
    const overlays = { scaleBar: this.#option('scale-bar'), compass: this.#option('compass'), markers: this.#option('markers') };
    this.#setBusy(true);
    try {
      const context = await this.#context();
      const maskColour = getComputedStyle(document.documentElement).getPropertyValue('--mask-colour').trim().replace('#', '');
      const picture = native
        ? await nativePicture(context, overlays, { maskColour })
        : await screenPicture(this.#container, context, overlays);
      const { field, hdu } = context.source;
      const where = isWholeField(hdu) ? 'field' : `hdu${hdu}`;
      const name = `${field}-${where}-${native ? 'native' : 'screen'}.png`.replace(/[^A-Za-z0-9._-]/g, '_');
      downloadBlob(name, picture.blob);
      this.dispatchEvent(new CustomEvent('saved', { detail: { name, width: picture.width, height: picture.height, resolution: native ? 'native' : 'screen' } }));
    } catch (error) {
      this.dispatchEvent(new CustomEvent('failed', { detail: error }));
    } finally {
      this.#setBusy(false);
    }
  }

  /** Downloads the FITS cutout of the visible box: the chip's own values, or the whole field's resampled canvas. */
  async saveCutout() {
    if (this.#busy) return;
    this.#setBusy(true);
    try {
      const source = this.#markerLayer.source;
      const box = this.#imageView.visibleBox;
      if (source === null || box === null) throw new ExportError('No part of the image is on screen.');
      if (this.#state.current.layout.view !== null) throw new ExportError('A cutout is of one image: switch the layout to “One image” first.');
      const blob = await getCutout(source, box);
      const where = isWholeField(source.hdu) ? 'field' : `hdu${source.hdu}`;
      // The box in the name: which pixels these are stays with the file.
      const name = `${source.field}-${source.band}-${where}-x${box.x0}-${box.x1}-y${box.y0}-${box.y1}.fits`.replace(/[^A-Za-z0-9._-]/g, '_');
      downloadBlob(name, blob);
      this.dispatchEvent(new CustomEvent('saved', { detail: { name, box } }));
    } catch (error) {
      this.dispatchEvent(new CustomEvent('failed', { detail: error }));
    } finally {
      this.#setBusy(false);
    }
  }

  // What is shown, and north, east and the scale at the middle of the view, asked afresh.
  async #context() {
    const source = this.#markerLayer.source;
    const screen = this.#imageView.screen;
    if (source === null || screen === null) throw new ExportError('Nothing is shown yet.');
    if (this.#state.current.layout.view !== null) throw new ExportError('A picture shows one image: switch the layout to “One image” first.');
    const tile = this.#container.querySelector('.image-tiles img.leaflet-tile');
    let sky = { north: null, east: null, pixelScale: null };
    if (source.sky) {
      const { x0, x1, y0, y1, width, height } = screen;
      sky = await getSky(source, { x0, x1, y0, y1, width, height });
    }
    return {
      source, screen, box: this.#imageView.visibleBox, tileSrc: tile?.src ?? null, placements: this.#markerLayer.placements,
      north: sky.north ?? null, east: sky.east ?? null, pixelScale: sky.pixelScale ?? null,
    };
  }

  #setBusy(busy) {
    this.#busy = busy;
    this.#saveButton.disabled = busy;
    this.#cutoutButton.disabled = busy;
    this.#root.setAttribute('aria-busy', String(busy));
  }
}
