// The image HDUs (chips) of the band being viewed, each with how far its tiles are prepared; first, when the band
// has one, its whole camera field.
import { fillSelect } from './select-options.js';
import { WHOLE_FIELD, isWholeField } from './whole-field.js';

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

function describe(hdu) {
  const failure = hdu.pyramid?.error ? ` — ${hdu.pyramid.error}` : '';
  // Which file holds the chip, and which HDU inside it (a band may be made of several files).
  const place = hdu.file ? `${hdu.file}, HDU ${hdu.fitsIndex ?? hdu.index}` : `HDU ${hdu.index}`;
  if (!isWholeField(hdu.index)) return `${place}: ${hdu.width} × ${hdu.height} pixels, BITPIX ${hdu.bitpix}${failure}`;
  const left = hdu.excluded.length > 0 ? `; ${hdu.excluded.length} left off` : '';
  return `All ${hdu.chips.length} chips on one sky grid of ${hdu.width} × ${hdu.height} pixels${left}${failure}`;
}

/** Fires `pick` with the chosen HDU index (a number, or 'canvas' for the whole field) in `detail`. */
export class HduPicker extends EventTarget {
  #select;

  constructor(select) {
    super();
    this.#select = select;
    select.addEventListener('change', () => {
      const detail = select.value === WHOLE_FIELD ? WHOLE_FIELD : Number(select.value);
      this.dispatchEvent(new CustomEvent('pick', { detail }));
    });
  }

  /** `hdus` as whole-field.js bandEntries gives them. */
  setHdus(hdus, selectedIndex) {
    fillSelect(
      this.#select,
      hdus.map((hdu) => ({
        value: hdu.index,
        label: `${hdu.name}${stateSuffix(hdu.pyramid)}`,
        title: describe(hdu),
      })),
      selectedIndex,
    );
  }
}
