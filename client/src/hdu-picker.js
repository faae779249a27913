// The image HDUs (chips) of the band being viewed, each with how far its tiles are prepared.
import { fillSelect } from './select-options.js';

function stateSuffix(pyramid) {
  switch (pyramid?.state) {
    case 'ready':
      return '';
    case 'building':
      return ` · preparing ${Math.floor((pyramid.progress ?? 0) * 100)} %`;
    case 'failed':
      return ' · failed';
    default:
      return ' · waiting';
  }
}

/** Fires `pick` with the chosen HDU index (a number) in `detail`. */
export class HduPicker extends EventTarget {
  #select;

  constructor(select) {
    super();
    this.#select = select;
    select.addEventListener('change', () => this.dispatchEvent(new CustomEvent('pick', { detail: Number(select.value) })));
  }

  setHdus(hdus, selectedIndex) {
    fillSelect(
      this.#select,
      hdus.map((hdu) => ({
        value: hdu.index,
        label: `${hdu.name}${stateSuffix(hdu.pyramid)}`,
        title: `HDU ${hdu.index}: ${hdu.width} × ${hdu.height} pixels, BITPIX ${hdu.bitpix}${hdu.pyramid?.error ? ` — ${hdu.pyramid.error}` : ''}`,
      })),
      selectedIndex,
    );
  }
}
