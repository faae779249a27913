// Pictures of the current view as PNG. At screen resolution the tiles already loaded are drawn into a canvas where
// they sit on screen (they come from this server, so the canvas stays readable); at native resolution the server
// renders the visible box at one image pixel per picture pixel (render.png). Overlays are drawn on top by
// export-overlays.js.
import { ApiError } from './api-error.js';
import { drawCompass, drawMarkers, drawScaleBar, overlayColours } from './export-overlays.js';

/** render.png's limit (RenderEndpoints.cs): larger boxes are refused. */
export const NATIVE_MAX_PIXELS = 50_000_000;

/** A typed error for an export that cannot be made, with what to do instead. */
export class ExportError extends Error {
  constructor(message) {
    super(message);
    this.name = 'ExportError';
  }
}

function canvasOf(width, height) {
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  return canvas;
}

function toBlob(canvas) {
  return new Promise((resolve, reject) => {
    canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new ExportError('The browser could not encode the picture as PNG.'))), 'image/png');
  });
}

function relative(rect, origin) {
  return { x: rect.left - origin.left, y: rect.top - origin.top, width: rect.width, height: rect.height };
}

// The masked colour under the tiles (mask-layer.js): plain blocks, or on the whole field the chips' outlines.
function drawMaskBlocks(ctx, container, origin, colour) {
  ctx.fillStyle = colour;
  for (const block of container.querySelectorAll('.mask-tiles .mask-block:not([hidden])')) {
    const at = relative(block.getBoundingClientRect(), origin);
    const path = block.querySelector('path');
    if (path === null) {
      ctx.fillRect(at.x, at.y, at.width, at.height);
      continue;
    }
    const scale = block.offsetWidth > 0 ? at.width / block.offsetWidth : 1;
    ctx.save();
    ctx.beginPath();
    ctx.rect(at.x, at.y, at.width, at.height);
    ctx.clip();
    ctx.translate(at.x, at.y);
    ctx.scale(scale, scale);
    ctx.fill(new Path2D(path.getAttribute('d') ?? ''));
    ctx.restore();
  }
}

/**
 * The view as it is on screen: `container` is the image view's element, `view` {screen, pixelScale, north, east,
 * placements} and `overlays` {scaleBar, compass, markers}. Resolves to {blob, width, height}.
 */
export async function screenPicture(container, view, overlays) {
  const origin = container.getBoundingClientRect();
  const ratio = window.devicePixelRatio || 1;
  const width = Math.round(origin.width * ratio);
  const height = Math.round(origin.height * ratio);
  if (width === 0 || height === 0) throw new ExportError('The image view has no size on screen.');
  const canvas = canvasOf(width, height);
  const ctx = canvas.getContext('2d');
  ctx.scale(ratio, ratio);
  const style = getComputedStyle(container);
  ctx.fillStyle = style.backgroundColor;
  ctx.fillRect(0, 0, origin.width, origin.height);
  drawMaskBlocks(ctx, container, origin, getComputedStyle(document.documentElement).getPropertyValue('--mask-colour').trim());

  // Past native zoom the page shows each pixel as a crisp block (app.css); below it, smoothed as the browser does.
  ctx.imageSmoothingEnabled = !container.classList.contains('past-native');
  let tiles = 0;
  for (const tile of container.querySelectorAll('.image-tiles img.leaflet-tile')) {
    if (!tile.complete || tile.naturalWidth === 0) continue;
    const at = relative(tile.getBoundingClientRect(), origin);
    ctx.drawImage(tile, at.x, at.y, at.width, at.height);
    tiles += 1;
  }
  if (tiles === 0) throw new ExportError('No tile of the image is loaded yet: wait for the image, then save again.');
  ctx.imageSmoothingEnabled = true;

  const { screen } = view;
  const colours = overlayColours();
  if (overlays.markers) {
    const toPicture = ([x, y]) => [
      ((x - screen.x0) / (screen.x1 - screen.x0)) * origin.width,
      ((screen.y1 - y) / (screen.y1 - screen.y0)) * origin.height,
    ];
    drawMarkers(ctx, view.placements, toPicture, colours);
  }
  if (overlays.compass) drawCompass(ctx, view.north, view.east, colours);
  if (overlays.scaleBar && view.pixelScale > 0) drawScaleBar(ctx, origin.width, origin.height, view.pixelScale / screen.scale, colours);
  return { blob: await toBlob(canvas), width, height };
}

/**
 * The render.png address for `box` ({x0, y0, x1, y1}, FITS inclusive) from the address of a tile of the image shown
 * (…/tiles/{field}/{z}/{x}/{y}.png?…): the same band, HDU and display, composite included.
 */
export function renderUrl(tileSrc, box, maskColour) {
  const url = new URL(tileSrc, document.baseURI);
  const segments = url.pathname.split('/');
  const at = segments.lastIndexOf('tiles', segments.length - 5);
  if (at < 0) throw new ExportError('The image shown is not drawn from tiles of this server.');
  const query = new URLSearchParams(url.search);
  // Tiles leave masked pixels transparent for the page to paint; a picture carries the masked colour itself.
  if (query.has('masked')) query.set('masked', maskColour);
  for (const [name, value] of Object.entries(box)) query.set(name, String(value));
  url.pathname = [...segments.slice(0, at), 'api', 'fields', segments[at + 1], 'render.png'].join('/');
  url.search = `?${query}`;
  return url.href;
}

/**
 * The visible box at native resolution (`view` as for screenPicture, plus `box` and `tileSrc`, a tile's address). Without overlays
 * the server's PNG is passed on untouched. Resolves to {blob, width, height}.
 */
export async function nativePicture(view, overlays, { maskColour, signal } = {}) {
  const { box } = view;
  if (box === null) throw new ExportError('No part of the image is on screen.');
  if (!view.tileSrc) throw new ExportError('No tile of the image is loaded yet: wait for the image, then save again.');
  const width = box.x1 - box.x0 + 1;
  const height = box.y1 - box.y0 + 1;
  if (width * height > NATIVE_MAX_PIXELS) {
    throw new ExportError(`The view covers ${width} × ${height} = ${(width * height).toLocaleString('en')} image pixels; `
      + `a native-resolution picture is at most ${NATIVE_MAX_PIXELS.toLocaleString('en')} (50 megapixels): zoom in, or save at screen resolution.`);
  }
  const response = await fetch(renderUrl(view.tileSrc, box, maskColour), { signal });
  if (!response.ok) throw await ApiError.fromResponse(response);
  const png = await response.blob();
  if (!overlays.markers && !overlays.compass && !overlays.scaleBar) return { blob: png, width, height };

  const image = await createImageBitmap(png);
  const canvas = canvasOf(image.width, image.height);
  const ctx = canvas.getContext('2d');
  ctx.drawImage(image, 0, 0);
  image.close();
  const colours = overlayColours();
  // Picture pixel (0, 0) is the top-left corner of FITS pixel (x0, y1).
  if (overlays.markers) drawMarkers(ctx, view.placements, ([x, y]) => [x - (box.x0 - 0.5), box.y1 + 0.5 - y], colours);
  if (overlays.compass) drawCompass(ctx, view.north, view.east, colours);
  if (overlays.scaleBar && view.pixelScale > 0) drawScaleBar(ctx, canvas.width, canvas.height, view.pixelScale, colours);
  return { blob: await toBlob(canvas), width: canvas.width, height: canvas.height };
}
