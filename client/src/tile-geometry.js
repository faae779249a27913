// The server's tile grid (see the tile API): zoom 0 holds the whole HDU in one 256-pixel tile, maxZoom is one image
// pixel per tile pixel, and each level pixel is the block of 2^(maxZoom - z) native pixels under it, counted from
// the top-left corner. The last level pixel of a row or column is drawn whenever any native pixel under it exists.

export const TILE_SIZE = 256;

/** Width and height in level pixels of zoom level `z` of a `width` x `height` image. */
export function levelSize(width, height, maxZoom, z) {
  const factor = 2 ** (maxZoom - z);
  return { width: Math.ceil(width / factor), height: Math.ceil(height / factor) };
}

/** How many of tile (x, y)'s 256 x 256 pixels, from its top-left corner, lie on the image. */
export function imagePartOfTile(geometry, { x, y, z }) {
  const level = levelSize(geometry.width, geometry.height, geometry.maxZoom, z);
  const clamp = (value) => Math.max(0, Math.min(TILE_SIZE, value));
  return { width: clamp(level.width - x * TILE_SIZE), height: clamp(level.height - y * TILE_SIZE) };
}
