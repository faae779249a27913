// The pixel under the pointer read in each band of a colour composite: one probe per band, asked together.
import { probePixel } from './api.js';

const SHORT = Object.freeze({ red: 'R', green: 'G', blue: 'B' });

/**
 * A probe for the pixel readout: for a source with `channels` ([{channel, band}]) the answer of the first band
 * with `channels` added ([{channel, short, band, value, bunit}]); otherwise the one band's answer.
 */
export async function probeChannels(source, x, y, signal) {
  if (!source.channels) return probePixel(source, x, y, signal);
  const answers = await Promise.all(source.channels.map(({ band }) => probePixel({ ...source, band }, x, y, signal)));
  return {
    ...answers[0],
    channels: source.channels.map(({ channel, band }, i) => ({
      channel, short: SHORT[channel], band, value: answers[i].value ?? null, bunit: answers[i].bunit ?? null,
    })),
  };
}
