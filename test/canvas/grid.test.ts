import { describe, expect, it } from 'vitest';
import { drawGrid, gridBudget } from '../../src/canvas/drawSheet';
import { countingContext } from './countingContext';

/**
 * The grid of any view is a bounded amount of work: at most one dot per
 * 9 px cell of the view and a border row, counted, whatever the view's
 * numbers (far off, where adding a grid step no longer changes a double;
 * zoomed anyhow; not numbers at all).
 */

describe('the grid', () => {
  const W = 1200;
  const H = 800;
  const budget = gridBudget(W, H);

  it('visits at most the budget of its view size for any view', () => {
    const c = countingContext();
    const views = [
      { x: 40, y: 20, zoom: 1.5 },
      { x: -1.5e20, y: 3e19, zoom: 1.5 }, // a part at x = 1e20 fitted into view: x + 10 === x there (IEEE 754 doubles)
      { x: 1e308, y: -1e308, zoom: 0.1 },
      { x: 0, y: 0, zoom: 8 },
      { x: 0, y: 0, zoom: 1e-300 },
      { x: 0, y: 0, zoom: 1e300 },
      { x: NaN, y: 0, zoom: 1 },
      { x: 0, y: 0, zoom: 0 },
      { x: Infinity, y: 0, zoom: 1 },
    ];
    for (const v of views) {
      c.reset();
      const visited = drawGrid(c.ctx, v, W, H);
      expect(visited, JSON.stringify(v)).toBeLessThanOrEqual(budget.cols * budget.rows);
      expect(c.calls(), JSON.stringify(v)).toBeLessThanOrEqual(budget.cols * budget.rows + 1);
    }
  });

  it('draws the ordinary view fully: every 10-unit dot of the visible area', () => {
    const c = countingContext();
    // 1200 × 800 px at zoom 1.5 from the origin: 1200/15 + 1 = 81 columns, 800/15 + 1 = 54 rows (grid step 10 units = 15 px)
    expect(drawGrid(c.ctx, { x: 0, y: 0, zoom: 1.5 }, W, H)).toBe(81 * 54);
  });
});
