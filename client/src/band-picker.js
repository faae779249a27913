// The bands (one FITS file each) of the field being viewed.
import { fillSelect, shorten } from './select-options.js';

/** Fires `pick` with the chosen band name in `detail`. */
export class BandPicker extends EventTarget {
  #select;

  constructor(select) {
    super();
    this.#select = select;
    select.addEventListener('change', () => this.dispatchEvent(new CustomEvent('pick', { detail: select.value })));
  }

  setBands(bands, selectedName) {
    fillSelect(
      this.#select,
      bands.map((band) => ({
        value: band.name,
        label: band.error ? shorten(`${band.name} — unreadable: ${band.error}`) : band.name,
        disabled: Boolean(band.error),
        title: band.error ? `${band.file} cannot be shown: ${band.error}` : band.file,
      })),
      selectedName,
    );
  }
}
