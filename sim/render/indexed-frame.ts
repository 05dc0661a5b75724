// One picture of an episode as palette indices (one byte a pixel), the form both the GIF and
// the PNG writer take, with the few drawing operations a wireframe of nodes and springs needs.
// Lines use Bresenham's algorithm (Bresenham, IBM Systems Journal 4(1), 1965), so the same
// coordinates always light the same pixels.

export class IndexedFrame {
  readonly pixels: Uint8Array;

  constructor(readonly widthPx: number, readonly heightPx: number, background = 0) {
    this.pixels = new Uint8Array(widthPx * heightPx).fill(background);
  }

  set(x: number, y: number, colour: number): void {
    if (x < 0 || y < 0 || x >= this.widthPx || y >= this.heightPx) return;
    this.pixels[y * this.widthPx + x] = colour;
  }

  fillRect(x0: number, y0: number, width: number, height: number, colour: number): void {
    for (let y = Math.max(0, y0); y < Math.min(this.heightPx, y0 + height); y++) {
      this.pixels.fill(colour, y * this.widthPx + Math.max(0, x0), y * this.widthPx + Math.min(this.widthPx, x0 + width));
    }
  }

  line(xa: number, ya: number, xb: number, yb: number, colour: number): void {
    let x0 = Math.round(xa);
    let y0 = Math.round(ya);
    const x1 = Math.round(xb);
    const y1 = Math.round(yb);
    const dx = Math.abs(x1 - x0);
    const dy = -Math.abs(y1 - y0);
    const sx = x0 < x1 ? 1 : -1;
    const sy = y0 < y1 ? 1 : -1;
    let error = dx + dy;
    // A far-off line is clipped pixel by pixel by set(); the bound keeps a bad coordinate from
    // turning into a loop over millions of pixels.
    for (let guard = 0; guard <= 4 * (this.widthPx + this.heightPx); guard++) {
      this.set(x0, y0, colour);
      if (x0 === x1 && y0 === y1) return;
      const twice = 2 * error;
      if (twice >= dy) {
        error += dy;
        x0 += sx;
      }
      if (twice <= dx) {
        error += dx;
        y0 += sy;
      }
    }
  }

  disc(cx: number, cy: number, radiusPx: number, colour: number): void {
    const x0 = Math.round(cx);
    const y0 = Math.round(cy);
    const r = Math.max(0, Math.round(radiusPx));
    for (let dy = -r; dy <= r; dy++) {
      for (let dx = -r; dx <= r; dx++) {
        if (dx * dx + dy * dy <= r * r + r) this.set(x0 + dx, y0 + dy, colour);
      }
    }
  }
}
