import { expect, test } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { parseCsv } from '../src/export/csv';
import { shot } from './helpers';

/** The sweep view's plots go onto the SVG sheet when chosen, and its data comes out as CSV. */

test('a finished sweep: its plots on the SVG sheet, its data as CSV', async ({ page, context }, info) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').waitFor();
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect.poll(() => page.evaluate(() => (window as any).__coilwright.state().solve.status)).toBe('solved');
  await page.getByRole('button', { name: /^Sweep/ }).click();
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  const from = Number(await page.getByTestId('sweep-from').inputValue().then((t) => t.replace(/k$/, 'e3')));
  const points = Number(await page.getByTestId('sweep-points').inputValue());

  await page.getByTestId('share-open').click();
  await expect(page.getByTestId('share-plots')).toBeEnabled();
  await expect(page.getByTestId('share-plots')).toBeChecked();
  await shot(page, info, 'share-with-sweep');
  const [svgDl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-svg').click()]);
  const file = info.outputPath('with-plots.svg');
  await svgDl.saveAs(file);
  const view = await context.newPage();
  await view.setViewportSize({ width: 1044, height: 715 });
  await view.goto(pathToFileURL(file).href);
  const facts = await view.evaluate(() => ({
    parserError: !!document.querySelector('parsererror'),
    plots: document.querySelectorAll('g.plot').length,
    paths: document.querySelectorAll('g.plot path[stroke]').length,
    scripts: document.getElementsByTagName('script').length,
    results: document.querySelectorAll('g.row').length,
  }));
  expect(facts.parserError).toBe(false);
  expect(facts.plots).toBeGreaterThanOrEqual(2); // magnitude and phase
  expect(facts.paths).toBeGreaterThan(0); // traces keep their strokes without the app's CSS
  expect(facts.scripts).toBe(0);
  expect(facts.results).toBeGreaterThan(5); // the results table is still there beside the plots
  await view.screenshot({ path: info.outputPath('with-plots.png') });
  await info.attach('with-plots', { path: info.outputPath('with-plots.png'), contentType: 'image/png' });

  const [csvDl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-sweep-csv').click()]);
  const rows = parseCsv(readFileSync(await csvDl.path(), 'utf8'));
  expect(rows[0][0]).toBe('f_Hz');
  expect(rows).toHaveLength(1 + points); // one row per swept frequency
  if (Number.isFinite(from)) expect(Number(rows[1][0])).toBeCloseTo(from, 6);
  for (const r of rows.slice(1)) {
    const [re, im, mag] = [Number(r[1]), Number(r[2]), Number(r[3])];
    expect(mag).toBe(Math.hypot(re, im)); // |z| = hypot(re, im), the writer's own invariant on the worker's values
  }
  for (let i = 2; i < rows.length; i++) expect(Number(rows[i][0])).toBeGreaterThan(Number(rows[i - 1][0])); // frequencies rise
});
