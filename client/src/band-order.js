// The default channel of each band: bands ordered by the wavelength their names suggest, longest to red. A name
// suggests a wavelength by a number with a unit (656nm, 1.2um, 5007a), a colour word (blue, red, infrared) or a
// one-letter photometric filter (common practice: U B V R I, then J H K). Without such names the listing order
// decides.

// Rough centres in nanometres (common practice; from memory, only the order matters).
const COLOUR_WORDS = Object.freeze([
  ['ultraviolet', 300], ['uv', 300], ['violet', 410], ['blue', 450], ['cyan', 490], ['green', 530],
  ['yellow', 580], ['orange', 600], ['red', 650], ['nir', 900], ['infrared', 1000], ['ir', 1000],
]);
const FILTER_LETTERS = Object.freeze({ u: 365, b: 440, g: 480, v: 550, r: 640, i: 790, z: 900, y: 1000, j: 1250, h: 1650, k: 2200 });
const UNITS = Object.freeze({ nm: 1, um: 1000, 'µm': 1000, mu: 1000, a: 0.1, 'å': 0.1, ang: 0.1 });

/** The wavelength (nm) a band name suggests, or null. */
export function suggestedWavelength(name) {
  const text = String(name).toLowerCase();
  const measured = text.match(/(\d+(?:\.\d+)?)\s*(nm|um|µm|mu|ang|a|å)(?![a-z])/);
  if (measured) return Number(measured[1]) * UNITS[measured[2]];
  const words = text.split(/[^a-zµå]+/).filter(Boolean);
  for (const [word, nm] of COLOUR_WORDS) {
    if (words.includes(word)) return nm;
  }
  if (words.length === 1 && words[0].length === 1 && FILTER_LETTERS[words[0]] !== undefined) return FILTER_LETTERS[words[0]];
  // A bare three- or four-digit number reads as nanometres.
  const bare = text.match(/(?:^|[^0-9.])(\d{3,4})(?![0-9.])/);
  return bare ? Number(bare[1]) : null;
}

/**
 * Band names for red, green and blue from `names` (in listing order). When at least two bands suggest a
 * wavelength, the longest goes to red, the shortest to blue and one between to green (bands that suggest none
 * are left out); otherwise the first three listed are red, green and blue. With fewer bands a channel repeats one.
 */
export function defaultChannels(names) {
  if (names.length === 0) return { red: null, green: null, blue: null };
  const known = names.map((name, index) => ({ name, index, nm: suggestedWavelength(name) }))
    .filter((band) => band.nm !== null)
    .sort((a, b) => a.nm - b.nm || a.index - b.index)
    .map((band) => band.name);
  if (known.length >= 2) {
    // Bluest first.
    return { blue: known[0], green: known[Math.floor((known.length - 1) / 2)], red: known[known.length - 1] };
  }
  return { red: names[0], green: names[Math.min(1, names.length - 1)], blue: names[Math.min(2, names.length - 1)] };
}
