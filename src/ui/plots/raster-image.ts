/**
 * Turns RGBA bytes into a PNG data URL through a scratch canvas, so raster pictures (scalp maps, epoch
 * images) can sit inside an SVG `<image>` and travel with it when the panel is exported as SVG.
 * Browser only (needs `document`); the CSP allows `img-src data:`.
 */
let scratch: HTMLCanvasElement | null = null;

export function rgbaToDataUrl(rgba: Uint8ClampedArray, width: number, height: number): string {
  if (typeof document === 'undefined' || width <= 0 || height <= 0) return '';
  scratch ??= document.createElement('canvas');
  scratch.width = width;
  scratch.height = height;
  const ctx = scratch.getContext('2d');
  if (!ctx) return '';
  // ImageData wants a buffer of exactly width·height·4 bytes; copy when given a larger view.
  const bytes = rgba.length === width * height * 4 ? rgba : rgba.slice(0, width * height * 4);
  ctx.putImageData(new ImageData(new Uint8ClampedArray(bytes), width, height), 0, 0);
  return scratch.toDataURL('image/png');
}
