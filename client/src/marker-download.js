// The marker list as files to keep: CSV (RFC 4180) and JSON, made in the page from the markers and where each
// lies on the image shown. Sky positions are ICRS, in decimal degrees and sexagesimal; sizes on the sky in arcsec;
// pixel positions FITS 1-based.
import { downloadBlob } from './download.js';

// 1 ms of RA and 0.01″ of Dec: the precision of the server's sexagesimal texts.
const RA_SECOND_DECIMALS = 3;
const DEC_SECOND_DECIMALS = 2;
const DEGREE_DECIMALS = 7;

function sexagesimal(units, decimals) {
  // Rounded once as a whole number of the last unit, so 59.9996 s carries into the next minute.
  const factor = 10 ** decimals;
  const total = Math.round(Math.abs(units) * 3600 * factor);
  const seconds = (total % (60 * factor)) / factor;
  const minutes = Math.floor(total / (60 * factor)) % 60;
  const whole = Math.floor(total / (3600 * factor));
  const pad = (n, width) => String(n).padStart(width, '0');
  const secondText = seconds.toFixed(decimals).padStart(decimals + 3, '0');
  return { whole, text: `${pad(minutes, 2)}:${secondText}`, pad };
}

/** RA in degrees as hours "hh:mm:ss.sss". */
export function formatRaHours(ra) {
  const { whole, text, pad } = sexagesimal((((ra % 360) + 360) % 360) / 15, RA_SECOND_DECIMALS);
  return `${pad(whole % 24, 2)}:${text}`;
}

/** Dec in degrees as "±dd:mm:ss.ss". */
export function formatDecDegrees(dec) {
  const { whole, text, pad } = sexagesimal(dec, DEC_SECOND_DECIMALS);
  const zero = whole === 0 && /^00:0+\.0+$/.test(text);
  return `${dec < 0 && !zero ? '-' : '+'}${pad(whole, 2)}:${text}`;
}

function degrees(value) {
  return Number(value.toFixed(DEGREE_DECIMALS));
}

/**
 * One plain record per marker: kind, label, sky position and sizes (arcsec) where it is on the sky, sizes in
 * pixels where it is in pixels, and `image`, `x`, `y`: where it lies on the image shown (null where it does not).
 */
export function markerRecords(markers, placements, shownHdu) {
  return markers.map((marker, i) => {
    const placement = placements[i];
    const on = placement?.on === true && placement.marker === marker;
    const record = {
      kind: marker.kind,
      label: marker.label,
      ra: marker.sky ? degrees(marker.ra) : null,
      dec: marker.sky ? degrees(marker.dec) : null,
      raSexagesimal: marker.sky ? formatRaHours(marker.ra) : null,
      decSexagesimal: marker.sky ? formatDecDegrees(marker.dec) : null,
      radiusArcsec: marker.sky && marker.kind === 'circle' ? marker.radius : null,
      widthArcsec: marker.sky && marker.kind === 'box' ? marker.width : null,
      heightArcsec: marker.sky && marker.kind === 'box' ? marker.height : null,
      radiusPixels: !marker.sky && marker.kind === 'circle' ? marker.radius : null,
      widthPixels: !marker.sky && marker.kind === 'box' ? marker.width : null,
      heightPixels: !marker.sky && marker.kind === 'box' ? marker.height : null,
      image: marker.sky ? (on ? shownHdu : null) : marker.hdu,
      x: marker.sky ? (on ? round(placement.x) : null) : marker.x,
      y: marker.sky ? (on ? round(placement.y) : null) : marker.y,
    };
    return record;
  });
}

function round(value) {
  return Math.round(value * 1000) / 1000;
}

const CSV_COLUMNS = Object.freeze([
  ['kind', 'kind'], ['label', 'label'], ['ra_deg', 'ra'], ['dec_deg', 'dec'], ['ra_hms', 'raSexagesimal'],
  ['dec_dms', 'decSexagesimal'], ['radius_arcsec', 'radiusArcsec'], ['width_arcsec', 'widthArcsec'],
  ['height_arcsec', 'heightArcsec'], ['radius_px', 'radiusPixels'], ['width_px', 'widthPixels'],
  ['height_px', 'heightPixels'], ['image', 'image'], ['x', 'x'], ['y', 'y'],
]);

function csvField(value) {
  if (value === null || value === undefined) return '';
  const text = String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The records as CSV with a header row, CRLF line ends (RFC 4180). */
export function markersCsv(records) {
  const lines = [CSV_COLUMNS.map(([name]) => name).join(',')];
  for (const record of records) lines.push(CSV_COLUMNS.map(([, key]) => csvField(record[key])).join(','));
  return `${lines.join('\r\n')}\r\n`;
}

/** The records as a JSON document naming what they were drawn on. */
export function markersJson(records, { field, band, hdu }) {
  return `${JSON.stringify({ field, band, image: hdu, frame: 'ICRS', markers: records }, null, 2)}\n`;
}

/** Hands `text` to the browser as a file download named `name`. */
export function downloadText(name, text, type) {
  downloadBlob(name, new Blob([text], { type }));
}
