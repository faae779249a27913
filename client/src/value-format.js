// How numbers read in the pixel readout.

// float32 carries 7 to 8 significant decimal digits; 7 shows every digit that means something.
const SIGNIFICANT = 7;

function trimMantissa(text) {
  const [mantissa, exponent] = text.split('e');
  const trimmed = mantissa.includes('.') ? mantissa.replace(/\.?0+$/, '') : mantissa;
  return exponent === undefined ? trimmed : `${trimmed}e${exponent}`;
}

/** A pixel value to 7 significant digits without trailing zeros: 61.25, -0.003125, 1.234568e+12. */
export function formatPixelValue(value) {
  if (!Number.isFinite(value)) return String(value);
  if (Number.isInteger(value) && Math.abs(value) < 1e15) return String(value);
  const magnitude = Math.abs(value);
  const text = magnitude !== 0 && (magnitude >= 1e9 || magnitude < 1e-4)
    ? value.toExponential(SIGNIFICANT - 1)
    : value.toPrecision(SIGNIFICANT);
  return trimMantissa(text);
}
