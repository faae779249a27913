// The whole camera field of a band: the server's common sky canvas of all its chips, shown as one image under the
// HDU key `canvas`. Here it is made to look like one more HDU of the band, so the view, tiles, statistics and sky
// tools handle it as they handle a chip.

/** The HDU key of the whole field in the URL and in every request (`hdu=canvas`). */
export const WHOLE_FIELD = 'canvas';

export const WHOLE_FIELD_NAME = 'Whole field';

export function isWholeField(hdu) {
  return hdu === WHOLE_FIELD;
}

/** The band's canvas as an HDU entry ({index: 'canvas', name, width, height, maxZoom, pyramid, sky, ...}), or null. */
export function wholeFieldEntry(band) {
  const canvas = band?.canvas;
  if (!canvas) return null;
  return {
    index: WHOLE_FIELD,
    name: WHOLE_FIELD_NAME,
    width: canvas.width,
    height: canvas.height,
    maxZoom: canvas.maxZoom,
    bitpix: -32,
    pyramid: canvas.pyramid ?? null,
    sky: canvas.sky ?? null,
    skyError: canvas.sky ? null : 'The whole field has no celestial coordinates.',
    chips: canvas.chips ?? [],
    excluded: canvas.excluded ?? [],
  };
}

/** Every entry of the band's chip picker, the whole field (when the band has one) first. */
export function bandEntries(band) {
  const whole = wholeFieldEntry(band);
  return whole === null ? band.hdus : [whole, ...band.hdus];
}
