// The markers panel: what the next marker is (kind, size, label), two ways to place it (clicking on the image, or a
// typed sky position the server parses as the go-to box does), the list of markers to edit, centre on or remove,
// and the CSV / JSON downloads.
import { probePixel, probePosition } from './api.js';
import { normaliseMarker, MAX_MARKERS, MAX_LABEL } from './marker-query.js';
import { markerRecords, markersCsv, markersJson, downloadText, formatRaHours, formatDecDegrees } from './marker-download.js';
import { WHOLE_FIELD, isWholeField } from './whole-field.js';

const KIND_NAMES = Object.freeze({ point: 'Point', circle: 'Circle', box: 'Box' });
const PIXELS_TYPED = /^\s*([-+]?\d+(?:\.\d*)?)\s*[,\s]\s*([-+]?\d+(?:\.\d*)?)\s*$/;

function fileStem(source) {
  const hdu = source === null ? '' : isWholeField(source.hdu) ? '-field' : `-hdu${source.hdu}`;
  return `${source?.field ?? 'markers'}${hdu}-markers`.replace(/[^A-Za-z0-9._-]/g, '_');
}

/**
 * Fires `change` (the new marker list in `detail`), `failed` (an Error to show) and `centre` ({x, y}: FITS pixels of
 * the image shown, to put in the middle of the view).
 */
export class MarkerPanel extends EventTarget {
  #root;
  #layer;
  #toggle;
  #source = null;
  #markers = [];
  #placements = [];
  #typed;
  #placeButton;
  #list;
  #empty;

  /** `root` holds the panel's markup (index.html), `toggle` opens and closes it, `layer` is the MarkerLayer. */
  constructor(root, toggle, layer) {
    super();
    this.#root = root;
    this.#toggle = toggle;
    this.#layer = layer;
    this.#typed = root.querySelector('[data-role=typed]');
    this.#placeButton = root.querySelector('[data-role=place]');
    this.#list = root.querySelector('[data-role=list]');
    this.#empty = root.querySelector('[data-role=empty]');
    root.querySelector('[data-role=label]').maxLength = MAX_LABEL;

    toggle.addEventListener('click', () => this.open = root.hidden);
    for (const input of root.querySelectorAll('input[name=marker-kind]')) input.addEventListener('change', () => this.#showSizes());
    this.#placeButton.addEventListener('click', () => this.#arm(!this.#layer.armed));
    this.#typed.addEventListener('submit', (event) => {
      event.preventDefault();
      this.#addTyped();
    });
    root.querySelector('[data-role=csv]').addEventListener('click', () => this.#download('csv'));
    root.querySelector('[data-role=json]').addEventListener('click', () => this.#download('json'));
    root.querySelector('[data-role=clear-all]').addEventListener('click', () => this.#emit([]));
    layer.addEventListener('pick', (event) => this.#addAt(event.detail));
    root.addEventListener('keydown', (event) => {
      if (event.key === 'Escape') this.open = false;
    });
    this.#showSizes();
    this.show([], []);
  }

  set open(on) {
    this.#root.hidden = !on;
    this.#toggle.setAttribute('aria-expanded', String(on));
    if (!on) this.#arm(false);
  }

  /** The image shown ({field, band, hdu, sky}) or null: where clicks and typed positions are looked up. */
  setSource(source) {
    this.#source = source;
    const sky = source?.sky === true;
    for (const unit of this.#root.querySelectorAll('[data-role=unit]')) unit.textContent = sky ? '″' : 'px';
    this.#root.querySelector('[data-role=position]').placeholder = sky ? 'RA Dec, e.g. 150.1 -2.3' : 'x y (this image has no WCS)';
    this.#toggle.disabled = source === null;
  }

  /** The markers of the state and where each lies on the image shown (MarkerLayer.placements). */
  show(markers, placements) {
    this.#markers = markers;
    // Placements of an older list (still being looked up) say nothing about this one.
    this.#placements = markers.map((marker, i) => (placements[i]?.marker === marker ? placements[i] : null));
    placements = this.#placements;
    this.#toggle.querySelector('[data-role=count]').textContent = markers.length > 0 ? String(markers.length) : '';
    this.#empty.hidden = markers.length > 0;
    for (const button of this.#root.querySelectorAll('[data-role=csv], [data-role=json], [data-role=clear-all]')) {
      button.disabled = markers.length === 0;
    }
    this.#list.replaceChildren(...markers.map((marker, index) => this.#row(marker, placements[index], index)));
  }

  #kind() {
    return this.#root.querySelector('input[name=marker-kind]:checked')?.value ?? 'point';
  }

  #showSizes() {
    const kind = this.#kind();
    for (const field of this.#root.querySelectorAll('[data-size]')) {
      field.hidden = !(field.dataset.size === 'radius' ? kind === 'circle' : kind === 'box');
    }
  }

  #arm(on) {
    this.#layer.armed = on && this.#source !== null;
    this.#placeButton.setAttribute('aria-pressed', String(this.#layer.armed));
  }

  // The marker the controls describe, at a place: {ra, dec} on the sky or {hdu, x, y} in pixels.
  #newMarker(place) {
    const value = (role) => this.#root.querySelector(`[data-role=${role}]`).value;
    const kind = this.#kind();
    const marker = normaliseMarker({
      kind, ...place, radius: value('radius'), width: value('width'), height: value('height'), label: value('label'),
    });
    if (marker === null) {
      const sizes = kind === 'circle' ? 'a radius' : 'a width and a height';
      throw new Error(`A ${kind} needs ${sizes} greater than zero.`);
    }
    return marker;
  }

  #add(place) {
    if (this.#markers.length >= MAX_MARKERS) throw new Error(`At most ${MAX_MARKERS} markers: remove one first.`);
    this.#emit([...this.#markers, this.#newMarker(place)]);
  }

  async #addAt({ x, y }) {
    const source = this.#source;
    if (source === null) return;
    try {
      if (!source.sky) {
        this.#add({ sky: false, hdu: source.hdu, x, y });
        return;
      }
      const answer = await probePixel({ field: source.field, band: source.band, hdu: source.hdu }, x, y);
      // A point with no sky position (a gap without a field WCS) is kept in pixels of this image.
      if (Number.isFinite(answer.ra) && Number.isFinite(answer.dec)) this.#add({ sky: true, ra: answer.ra, dec: answer.dec });
      else this.#add({ sky: false, hdu: source.hdu, x, y });
    } catch (error) {
      this.#fail(error);
    }
  }

  async #addTyped() {
    const source = this.#source;
    const input = this.#root.querySelector('[data-role=position]');
    const text = input.value.trim();
    if (source === null) return;
    try {
      if (text === '') throw new Error(source.sky ? 'Type a position first: RA and Dec, e.g. 10:00:24.0 -02:18:00 or 150.1 -2.3.' : 'Type a pixel position first: x and y.');
      if (!source.sky) {
        const match = PIXELS_TYPED.exec(text);
        if (match === null) throw new Error(`“${text}” is not a pixel position: this image has no WCS, so type x and y (FITS pixels).`);
        this.#add({ sky: false, hdu: source.hdu, x: Number(match[1]), y: Number(match[2]) });
      } else {
        // Looked up over the whole band: a marker may lie on another chip than the one shown.
        const answer = await probePosition({ field: source.field, band: source.band, hdu: isWholeField(source.hdu) ? WHOLE_FIELD : null }, text);
        if (!Number.isFinite(answer.ra) || !Number.isFinite(answer.dec)) throw new Error(`The server found no sky position for “${text}”.`);
        this.#add({ sky: true, ra: answer.ra, dec: answer.dec });
      }
      input.value = '';
      input.removeAttribute('aria-invalid');
    } catch (error) {
      input.setAttribute('aria-invalid', 'true');
      this.#fail(error);
    }
  }

  #fail(error) {
    this.dispatchEvent(new CustomEvent('failed', { detail: error }));
  }

  #emit(markers) {
    this.dispatchEvent(new CustomEvent('change', { detail: markers }));
  }

  #replace(index, changes) {
    const next = normaliseMarker({ ...this.#markers[index], ...changes });
    if (next === null) {
      this.#fail(new Error('A size must be a number greater than zero.'));
      this.show(this.#markers, this.#placements);
      return;
    }
    this.#emit(this.#markers.map((marker, i) => (i === index ? next : marker)));
  }

  #row(marker, placement, index) {
    const row = document.createElement('li');
    row.className = 'marker-row';
    row.dataset.index = String(index);
    row.dataset.kind = marker.kind;
    row.dataset.on = String(placement?.on === true);

    const kind = document.createElement('span');
    kind.className = `marker-kind marker-kind-${marker.kind}`;
    kind.title = KIND_NAMES[marker.kind];
    kind.setAttribute('aria-label', KIND_NAMES[marker.kind]);

    const label = document.createElement('input');
    label.type = 'text';
    label.className = 'marker-row-label';
    label.value = marker.label;
    label.maxLength = MAX_LABEL;
    label.placeholder = 'label';
    label.setAttribute('aria-label', `Label of marker ${index + 1}`);
    label.addEventListener('change', () => this.#replace(index, { label: label.value }));

    const where = document.createElement('span');
    where.className = 'marker-row-where';
    where.textContent = marker.sky ? `${formatRaHours(marker.ra)} ${formatDecDegrees(marker.dec)}` : `x ${marker.x} y ${marker.y} px`;
    if (placement && !placement.on) where.title = placement.why;

    const sizes = document.createElement('span');
    sizes.className = 'marker-row-sizes';
    const unit = marker.sky ? '″' : 'px';
    const sizeKeys = marker.kind === 'circle' ? ['radius'] : marker.kind === 'box' ? ['width', 'height'] : [];
    for (const key of sizeKeys) {
      const input = document.createElement('input');
      input.type = 'number';
      input.min = '0';
      input.step = 'any';
      input.value = String(marker[key]);
      input.dataset.markerSize = key;
      input.setAttribute('aria-label', `${key} of marker ${index + 1} (${marker.sky ? 'arcsec' : 'pixels'})`);
      input.addEventListener('change', () => this.#replace(index, { [key]: input.value }));
      sizes.append(input);
    }
    if (sizeKeys.length > 0) sizes.append(unit);

    const centre = document.createElement('button');
    centre.type = 'button';
    centre.className = 'small-button';
    centre.dataset.role = 'centre';
    centre.textContent = 'Show';
    centre.disabled = placement?.on !== true;
    centre.title = placement?.on ? 'Put it in the middle of the view' : placement?.why ?? '';
    centre.addEventListener('click', () => this.dispatchEvent(new CustomEvent('centre', { detail: { x: placement.x, y: placement.y } })));

    const remove = document.createElement('button');
    remove.type = 'button';
    remove.className = 'small-button marker-remove';
    remove.dataset.role = 'remove';
    remove.textContent = '×';
    remove.title = 'Remove this marker';
    remove.setAttribute('aria-label', `Remove marker ${index + 1}`);
    remove.addEventListener('click', () => this.#emit(this.#markers.filter((_, i) => i !== index)));

    row.append(kind, label, where, sizes, centre, remove);
    return row;
  }

  #download(format) {
    const source = this.#source ?? { field: null, band: null, hdu: null };
    const records = markerRecords(this.#markers, this.#placements, source.hdu);
    const stem = fileStem(this.#source);
    if (format === 'csv') downloadText(`${stem}.csv`, markersCsv(records), 'text/csv');
    else downloadText(`${stem}.json`, markersJson(records, source), 'application/json');
  }
}
