// The scale bar, compass and markers drawn into an exported picture (a 2D canvas) rather than over the page:
// the same lengths, directions and places as on screen, in the page's own colours.
import { chooseLength as chooseBarLength } from './scale-bar.js';
import { formatAngle } from './sky-format.js';

const FONT = '12px ui-monospace, monospace';
const MARGIN = 12;

function cssColour(name, fallback) {
  const value = getComputedStyle(document.documentElement).getPropertyValue(name).trim();
  return value === '' ? fallback : value;
}

/** Colours the overlays are drawn in, read from app.css so an export looks like the page. */
export function overlayColours() {
  return {
    marker: cssColour('--region', '#ff9e7a'),
    text: cssColour('--text', '#b9b4aa'),
    accent: cssColour('--accent', '#c68a3a'),
    backing: 'rgba(22, 24, 27, 0.85)',
    edge: cssColour('--panel-edge', '#2a2d32'),
  };
}

/**
 * A bar of a round angular length at the bottom right of a `width` x `height` picture, `arcsecPerPixel` arcsec per
 * picture pixel; false when no round length fits.
 */
export function drawScaleBar(ctx, width, height, arcsecPerPixel, colours = overlayColours()) {
  const length = chooseBarLength(arcsecPerPixel);
  if (length === null) return false;
  const pixels = length / arcsecPerPixel;
  const label = formatAngle(length);
  ctx.save();
  ctx.font = FONT;
  const boxWidth = Math.max(pixels, ctx.measureText(label).width) + 20;
  const boxHeight = 34;
  const left = width - MARGIN - boxWidth;
  const top = height - MARGIN - boxHeight;
  ctx.fillStyle = colours.backing;
  ctx.fillRect(left, top, boxWidth, boxHeight);
  ctx.strokeStyle = colours.edge;
  ctx.lineWidth = 1;
  ctx.strokeRect(left + 0.5, top + 0.5, boxWidth - 1, boxHeight - 1);
  ctx.fillStyle = colours.text;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  ctx.fillText(label, left + boxWidth / 2, top + 5);
  // A bracket open at the top, as on the page.
  const barLeft = left + (boxWidth - pixels) / 2;
  ctx.strokeStyle = colours.text;
  ctx.lineWidth = 2;
  ctx.beginPath();
  ctx.moveTo(barLeft + 1, top + 21);
  ctx.lineTo(barLeft + 1, top + 27);
  ctx.lineTo(barLeft + pixels - 1, top + 27);
  ctx.lineTo(barLeft + pixels - 1, top + 21);
  ctx.stroke();
  ctx.restore();
  return true;
}

/**
 * Arrows towards north and east ({dx, dy} unit vectors in pixel axes, y up, as /sky gives them) at the top left;
 * false when either is missing.
 */
export function drawCompass(ctx, north, east, colours = overlayColours()) {
  if (!isVector(north) || !isVector(east)) return false;
  const radius = 48;
  const [cx, cy] = [MARGIN + radius, MARGIN + radius];
  ctx.save();
  ctx.fillStyle = colours.backing;
  ctx.beginPath();
  ctx.arc(cx, cy, radius, 0, 2 * Math.PI);
  ctx.fill();
  ctx.strokeStyle = colours.edge;
  ctx.lineWidth = 1;
  ctx.stroke();
  arrow(ctx, cx, cy, north, 'N', colours.accent);
  arrow(ctx, cx, cy, east, 'E', colours.text);
  ctx.restore();
  return true;
}

function arrow(ctx, cx, cy, { dx, dy }, name, colour) {
  const length = Math.hypot(dx, dy);
  // The picture's y runs down.
  const [sx, sy] = [dx / length, -dy / length];
  const [tipX, tipY] = [cx + sx * 29, cy + sy * 29];
  ctx.strokeStyle = colour;
  ctx.fillStyle = colour;
  ctx.lineWidth = 2.5;
  ctx.lineCap = 'round';
  ctx.beginPath();
  ctx.moveTo(cx, cy);
  ctx.lineTo(tipX, tipY);
  ctx.stroke();
  ctx.beginPath();
  ctx.moveTo(tipX + sx * 5, tipY + sy * 5);
  ctx.lineTo(tipX - sy * 4, tipY + sx * 4);
  ctx.lineTo(tipX + sy * 4, tipY - sx * 4);
  ctx.closePath();
  ctx.fill();
  ctx.font = '600 13px system-ui, sans-serif';
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  ctx.fillText(name, cx + sx * 40, cy + sy * 40);
}

/**
 * The markers placed on the image (MarkerLayer.placements), `toPicture([x, y])` mapping FITS pixels to picture
 * pixels; returns how many were drawn.
 */
export function drawMarkers(ctx, placements, toPicture, colours = overlayColours()) {
  let drawn = 0;
  ctx.save();
  ctx.strokeStyle = colours.marker;
  ctx.fillStyle = colours.marker;
  ctx.lineWidth = 2;
  ctx.font = FONT;
  for (const placement of placements) {
    if (!placement?.on) continue;
    const { marker, x, y, outline } = placement;
    const [px, py] = toPicture([x, y]);
    let labelAt = [px + 12, py + 4];
    ctx.textAlign = 'left';
    if (outline.length > 0) {
      ctx.beginPath();
      outline.forEach((point, i) => {
        const [qx, qy] = toPicture(point);
        if (i === 0) ctx.moveTo(qx, qy);
        else ctx.lineTo(qx, qy);
      });
      ctx.closePath();
      ctx.stroke();
      const top = outline.map(toPicture).reduce((best, point) => (point[1] < best[1] ? point : best));
      labelAt = [px, top[1] - 6];
      ctx.textAlign = 'center';
    } else {
      ctx.beginPath();
      ctx.moveTo(px - 8, py);
      ctx.lineTo(px - 3, py);
      ctx.moveTo(px + 3, py);
      ctx.lineTo(px + 8, py);
      ctx.moveTo(px, py - 8);
      ctx.lineTo(px, py - 3);
      ctx.moveTo(px, py + 3);
      ctx.lineTo(px, py + 8);
      ctx.stroke();
    }
    if (marker.label !== '') ctx.fillText(marker.label, labelAt[0], labelAt[1]);
    drawn += 1;
  }
  ctx.restore();
  return drawn;
}

function isVector(vector) {
  return vector !== null && vector !== undefined && Number.isFinite(vector.dx) && Number.isFinite(vector.dy)
    && Math.hypot(vector.dx, vector.dy) > 0;
}
