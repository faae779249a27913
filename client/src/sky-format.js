// How sky angles read in the client. Decimal degrees carry 6 decimals (3.6 mas), finer than the sexagesimal texts
// the server sends (1 ms of time, 10 mas), so neither hides a digit the other shows.
const DEGREE_DECIMALS = 6;

/** An angle in decimal degrees: "188.736621°"; with `signed`, a leading + or - ("+12.500000°", "-1.034292°"). */
export function formatDegrees(value, { signed = false } = {}) {
  if (!Number.isFinite(value)) return '–';
  const text = Math.abs(value).toFixed(DEGREE_DECIMALS);
  // -0.0000001 rounds to zero: no sign on a zero.
  const zero = Number(text) === 0;
  const sign = value < 0 && !zero ? '-' : signed ? '+' : '';
  return `${sign}${text}°`;
}

/** An angular length in arcseconds as a short label: 0.5″, 20″, 2′, 1.5°. */
export function formatAngle(arcsec) {
  if (arcsec >= 3600) return `${trim(arcsec / 3600)}°`;
  if (arcsec >= 60) return `${trim(arcsec / 60)}′`;
  return `${trim(arcsec)}″`;
}

function trim(value) {
  return String(Number(value.toPrecision(6)));
}
