/** Drawing part definitions' primitives onto a 2D canvas context. */
import type { Mark, Prim } from '../model/parts/types';
import type { Placement } from '../model/geometry';
import { toSheet } from '../model/geometry';

/** The font sizes (sheet units; screen px at 100 % zoom) of the text drawn since the sheet's last frame began; tests read them. */
export const drawnText: { sizes: Set<number> } = { sizes: new Set() };

/** Sets the context's font and notes its size in `drawnText`. */
export function setFont(c: CanvasRenderingContext2D, size: number, family: string, weight = ''): void {
  c.font = `${weight ? `${weight} ` : ''}${size}px ${family}`;
  drawnText.sizes.add(size);
}

export function drawPrims(c: CanvasRenderingContext2D, pl: Placement, prims: Prim[], color: string): void {
  c.save();
  c.translate(pl.x, pl.y);
  c.rotate((pl.rot * Math.PI) / 2);
  if (pl.mirror) c.scale(-1, 1);
  c.strokeStyle = color;
  c.fillStyle = color;
  for (const p of prims) {
    switch (p.t) {
      case 'line':
        c.beginPath();
        c.moveTo(p.p[0], p.p[1]);
        for (let i = 2; i < p.p.length; i += 2) c.lineTo(p.p[i], p.p[i + 1]);
        c.stroke();
        break;
      case 'poly':
        c.beginPath();
        c.moveTo(p.p[0], p.p[1]);
        for (let i = 2; i < p.p.length; i += 2) c.lineTo(p.p[i], p.p[i + 1]);
        c.closePath();
        if (p.fill) c.fill(); else c.stroke();
        break;
      case 'rect':
        c.strokeRect(p.x, p.y, p.w, p.h);
        break;
      case 'circle':
        c.beginPath();
        c.arc(p.x, p.y, p.r, 0, Math.PI * 2);
        if (p.fill) c.fill(); else c.stroke();
        break;
      case 'arc':
        c.beginPath();
        c.arc(p.x, p.y, p.r, p.a0, p.a1);
        c.stroke();
        break;
      case 'text':
        break;
    }
  }
  c.restore();
  for (const p of prims) {
    if (p.t !== 'text') continue;
    const q = toSheet(pl, p.x, p.y);
    setFont(c, p.size, 'sans-serif');
    c.fillText(p.s, q.x, q.y);
  }
}

/** Upright marks (polarity dots, node names) in sheet coordinates. */
export function drawMarks(c: CanvasRenderingContext2D, marks: Mark[], color: string, font = '"JetBrains Mono", ui-monospace, monospace'): void {
  c.fillStyle = color;
  for (const m of marks) {
    if (m.t === 'dot') {
      c.beginPath();
      c.arc(m.x, m.y, m.r, 0, Math.PI * 2);
      c.fill();
    } else {
      setFont(c, m.size, m.mono ? font : 'sans-serif', m.bold ? '600' : '');
      c.textAlign = 'left';
      c.fillText(m.s, m.x, m.y);
    }
  }
}
