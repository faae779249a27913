// Draws a list of "rrggbb" colours as a horizontal strip on a canvas, lowest value at the left.

/** Paints `colors` across `canvas`, one column (or more) per colour. */
export function paintStrip(canvas, colors) {
  const context = canvas.getContext('2d');
  const { width, height } = canvas;
  context.clearRect(0, 0, width, height);
  if (!colors || colors.length === 0) return;
  const image = context.createImageData(colors.length, 1);
  colors.forEach((hex, i) => {
    const rgb = Number.parseInt(hex, 16);
    image.data.set([(rgb >> 16) & 255, (rgb >> 8) & 255, rgb & 255, 255], i * 4);
  });
  // One row of true colours, scaled up without smoothing: every column is a colour the server would draw.
  const row = new OffscreenCanvas(colors.length, 1);
  row.getContext('2d').putImageData(image, 0, 0);
  context.imageSmoothingEnabled = false;
  context.drawImage(row, 0, 0, width, height);
}
