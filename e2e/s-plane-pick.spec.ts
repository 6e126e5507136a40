/**
 * The s-domain view tried as a user would: the input and the output picked on the drawing, the poles marked on
 * the sweep's plot, and the view onto the SVG sheet and into a CSV.
 */
import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { parseCsv } from '../src/export/csv';
import { shot } from './helpers';

const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());

async function clickAt(page: Page, x: number, y: number) {
  const box = (await page.getByTestId('sheet-canvas').boundingBox())!;
  const p = await page.evaluate(([a, b]) => (window as any).__coilwright.toScreen(a, b), [x, y]);
  await page.mouse.click(box.x + p.x, box.y + p.y);
}

/** Click a part between its two pins on the drawing. */
async function clickPart(page: Page, ref: string) {
  const [a, b] = await page.evaluate((r) => [(window as any).__coilwright.pin(r, 0), (window as any).__coilwright.pin(r, 1)], ref);
  await clickAt(page, (a.x + b.x) / 2, (a.y + b.y) / 2);
  await expect.poll(async () => { const s = await state(page); return s.sheet.parts.find((p: any) => p.id === s.selection[0])?.ref; }).toBe(ref);
}

async function openView(page: Page, name: RegExp) {
  const tab = page.getByRole('toolbar', { name: 'Analysis views' }).getByRole('button', { name });
  if ((await tab.getAttribute('aria-pressed')) !== 'true') await tab.click();
  await expect(tab).toHaveAttribute('aria-pressed', 'true');
}

test('pick the input and the output on the sheet; the poles on the sweep; the view on the SVG sheet and as CSV', async ({ page, context }, info) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto('/');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await page.getByRole('toolbar', { name: 'Edit and view' }).getByRole('button', { name: /^Show all/ }).click();
  await openView(page, /^Poles and zeros/);
  const panel = page.getByTestId('sdomain-panel');

  // the output first: a wire picks its node's voltage
  await panel.getByTestId('tf-pick-output').click();
  await expect(panel.getByTestId('tf-pick-hint')).toBeVisible();
  const wire = await page.evaluate(() => {
    const s = (window as any).__coilwright.state();
    const w = s.sheet.wires[0];
    return { x: (w.pts[0] + w.pts[2]) / 2, y: (w.pts[1] + w.pts[3]) / 2, node: s.solve.circuit.topology.wireNodes[0] };
  });
  await clickAt(page, wire.x, wire.y);
  await expect(panel.getByTestId('tf-output')).toHaveValue(`node:${wire.node}`);
  await expect(panel.getByTestId('tf-pick-output')).toHaveAttribute('aria-pressed', 'false');

  // a part that is not a source cannot be the input: said, and the pick stays on
  await panel.getByTestId('tf-pick-input').click();
  await clickPart(page, 'Rbat');
  await expect(panel.getByTestId('tf-pick-note')).toContainText('“Rbat” is not a voltage or current source');
  await expect(panel.getByTestId('tf-pick-input')).toHaveAttribute('aria-pressed', 'true');
  await clickPart(page, 'Vinv');
  await expect(panel.getByTestId('tf-input')).toHaveValue('Vinv');
  await expect(panel.getByTestId('tf-pick-note')).toHaveCount(0);

  // the output: the load's voltage, picked on the drawing
  await panel.getByTestId('tf-pick-output').click();
  await clickPart(page, 'Rbat');
  await expect(panel.getByTestId('tf-output')).toHaveValue('voltage:Rbat');
  // two L and two C, all seen at the load: four poles, two split pairs (coupled tuned resonators)
  const poles = panel.getByTestId('splane-pole');
  await expect(poles).toHaveCount(4);
  const ps: { re: number; im: number }[] = await poles.evaluateAll((els) => els.map((e) => ({ re: Number(e.getAttribute('data-re')), im: Number(e.getAttribute('data-im')) })));
  // f = |p|/2π of each pair (rootFacts' definition), one per conjugate pair
  const fs = [...new Set(ps.filter((p) => p.im > 0).map((p) => Math.hypot(p.re, p.im) / (2 * Math.PI)))].sort((a, b) => a - b);
  expect(fs).toHaveLength(2);
  await shot(page, info, 's-plane-picked');

  // the CSV of the view: the same poles
  const [csv] = await Promise.all([page.waitForEvent('download'), panel.getByTestId('tf-csv').click()]);
  const rows = parseCsv(readFileSync(await csv.path(), 'utf8'));
  expect(rows[0][0]).toBe('root');
  const csvPoles = rows.filter((r) => r[0] === 'pole');
  expect(csvPoles).toHaveLength(4);
  for (const r of csvPoles) expect(ps.some((p) => p.re === Number(r[1]) && p.im === Number(r[2]))).toBe(true); // unrounded, as drawn

  // the SVG sheet carries the s-plane picture
  await page.getByTestId('share-open').click();
  await expect(page.getByTestId('share-plots')).toBeChecked();
  const [svgDl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-svg').click()]);
  const svg = readFileSync(await svgDl.path(), 'utf8');
  expect(svg).toContain('Poles and zeros of H(s), from Vinv to voltage across Rbat');
  await page.keyboard.press('Escape');

  // the sweep marks the two pole frequencies of that pair on its magnitude plot
  await openView(page, /^Sweep/);
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  const marks = page.getByTestId('plot-magnitude').locator('g.mark[data-kind="pole"]');
  await expect(marks).toHaveCount(2);
  const xs = (await marks.evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-x'))))).sort((a, b) => a - b);
  xs.forEach((x, i) => expect(x / fs[i]).toBeCloseTo(1, 9));
  await expect(page.getByTestId('sweep-markers').locator('li[data-kind="pole"]')).toHaveCount(2);
  await expect(page.getByTestId('sweep-markers')).toContainText('from the s-domain view (Vinv to voltage:Rbat)');
  await shot(page, info, 'sweep-with-poles');
  // the marks follow the view's choice
  await openView(page, /^Poles and zeros/);
  await page.getByTestId('tf-mark-sweep').uncheck();
  await openView(page, /^Sweep/);
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  await expect(page.getByTestId('plot-magnitude').locator('g.mark[data-kind="pole"]')).toHaveCount(0);
});
