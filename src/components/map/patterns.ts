/**
 * Fill patterns for reference-layer classes: a pale wash of the class colour plus a pattern
 * (hatch, dots, cross …) drawn in it, so classes differ by pattern as well as colour.
 * Browser only (canvas). Patterns are cached per colour and pattern.
 */
import type { Pattern } from '~/lib/gis/reference-kinds';

const cache = new Map<string, CanvasPattern | string>();
const SIZE = 10;

export function hexToRgba(hex: string, alpha: number): string {
  const n = Number.parseInt(hex.slice(1), 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}

/** Draws one pattern tile; shared by the map (canvas) and nothing else. */
function drawTile(ctx: CanvasRenderingContext2D, colour: string, pattern: Pattern): void {
  ctx.fillStyle = hexToRgba(colour, 0.16);
  ctx.fillRect(0, 0, SIZE, SIZE);
  ctx.strokeStyle = hexToRgba(colour, 0.85);
  ctx.fillStyle = hexToRgba(colour, 0.85);
  ctx.lineWidth = 1.2;
  const line = (x1: number, y1: number, x2: number, y2: number) => {
    ctx.beginPath();
    ctx.moveTo(x1, y1);
    ctx.lineTo(x2, y2);
    ctx.stroke();
  };
  if (pattern === 'hatch') {
    line(0, SIZE, SIZE, 0);
    line(-1, 1, 1, -1);
    line(SIZE - 1, SIZE + 1, SIZE + 1, SIZE - 1);
  }
  if (pattern === 'backslash') {
    line(0, 0, SIZE, SIZE);
    line(-1, SIZE - 1, 1, SIZE + 1);
    line(SIZE - 1, -1, SIZE + 1, 1);
  }
  if (pattern === 'cross') {
    line(0, SIZE, SIZE, 0);
    line(0, 0, SIZE, SIZE);
  }
  if (pattern === 'vertical') line(SIZE / 2, 0, SIZE / 2, SIZE);
  if (pattern === 'horizontal') line(0, SIZE / 2, SIZE, SIZE / 2);
  if (pattern === 'dots') {
    ctx.beginPath();
    ctx.arc(SIZE / 2, SIZE / 2, 1.6, 0, Math.PI * 2);
    ctx.fill();
  }
  if (pattern === 'grid') {
    line(SIZE / 2, 0, SIZE / 2, SIZE);
    line(0, SIZE / 2, SIZE, SIZE / 2);
  }
  if (pattern === 'rings') {
    ctx.beginPath();
    ctx.arc(SIZE / 2, SIZE / 2, 2.6, 0, Math.PI * 2);
    ctx.stroke();
  }
  if (pattern === 'checker') {
    ctx.fillStyle = hexToRgba(colour, 0.5);
    ctx.fillRect(0, 0, SIZE / 2, SIZE / 2);
    ctx.fillRect(SIZE / 2, SIZE / 2, SIZE / 2, SIZE / 2);
  }
  if (pattern === 'solid') {
    ctx.fillStyle = hexToRgba(colour, 0.24);
    ctx.fillRect(0, 0, SIZE, SIZE);
  }
}

export function fillFor(colour: string, pattern: Pattern): CanvasPattern | string {
  const key = `${colour}|${pattern}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const canvas = document.createElement('canvas');
  canvas.width = SIZE;
  canvas.height = SIZE;
  const ctx = canvas.getContext('2d')!;
  drawTile(ctx, colour, pattern);
  const made = ctx.createPattern(canvas, 'repeat') ?? hexToRgba(colour, 0.3);
  cache.set(key, made);
  return made;
}
