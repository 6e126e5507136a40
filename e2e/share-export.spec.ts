import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { polarText } from '../src/export';
import { RESULTS_HEADER, parseCsv } from '../src/export/csv';
import { shot } from './helpers';

/**
 * The demo sheet leaves the app as a document: the SVG sheet (opened on its
 * own and read), the results as CSV, a PNG of the canvas, and the browser's
 * print, which is the SVG sheet and nothing of the app.
 */

const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());

async function solvedDemo(page: Page) {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').waitFor();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
}

async function fromPanel(page: Page, testId: string) {
  if (!(await page.getByTestId('share-panel').isVisible())) await page.getByTestId('share-open').click();
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testId).click()]);
  return dl;
}

test('the demo exports as an SVG sheet whose values are the solver\'s', async ({ page, context }, info) => {
  await solvedDemo(page);
  const s = await state(page);
  await page.getByTestId('share-open').click();
  await page.getByRole('radio', { name: 'Letter' }).check();
  await page.getByTestId('share-notes').fill('Checked on the bench, 2 Dec');
  await shot(page, info, 'share-panel');
  const dl = await fromPanel(page, 'share-svg');
  expect(dl.suggestedFilename()).toMatch(/\.svg$/);
  const file = info.outputPath('demo.svg');
  await dl.saveAs(file);

  const view = await context.newPage();
  // Letter landscape less 10.5 mm margins: 258.4 mm × 194.9 mm, about 977 × 737 px at 96 px per inch
  await view.setViewportSize({ width: 980, height: 740 });
  await view.goto(pathToFileURL(file).href);
  const facts = await view.evaluate(() => {
    const svg = document.documentElement;
    const cells: Record<string, Record<string, string>> = {};
    for (const row of document.querySelectorAll('g.row')) {
      const name = row.getAttribute('data-name')!;
      cells[name] = {};
      for (const t of row.querySelectorAll('text')) cells[name][t.getAttribute('class')!.replace('cell ', '')] = t.textContent!;
    }
    return {
      root: svg.localName, width: svg.getAttribute('width'), height: svg.getAttribute('height'),
      parserError: !!document.querySelector('parsererror'), text: svg.textContent ?? '', cells,
    };
  });
  expect(facts.root).toBe('svg');
  expect(facts.parserError).toBe(false);
  // ANSI Letter is 279.4 mm × 215.9 mm; less 2 × 10.5 mm margins (the export's print margin)
  expect([facts.width, facts.height]).toEqual(['258.4mm', '194.9mm']);
  expect(facts.text).toContain('Checked on the bench, 2 Dec');
  // each part's current in the table is the worker's solve, written magnitude∠angle to 4 digits
  const parts = Object.entries(s.solve.result.elements as Record<string, any>).filter(([, r]) => 'current' in r);
  expect(parts.length).toBeGreaterThan(3);
  for (const [id, r] of parts) {
    const m = Math.hypot(r.current.re, r.current.im);
    const deg = (Math.atan2(r.current.im, r.current.re) * 180) / Math.PI;
    expect(facts.cells[id]?.i, id).toBe(polarText(m, deg, 'A')); // the solver's value (the app's worker), formatted as the sheet writes it
  }
  await view.screenshot({ path: info.outputPath('demo-svg.png') });
  await info.attach('demo-svg', { path: info.outputPath('demo-svg.png'), contentType: 'image/png' });
});

test('results CSV carries the solver\'s numbers; PNG of the canvas; print is the SVG sheet', async ({ page }, info) => {
  await solvedDemo(page);
  const s = await state(page);

  const csv = readFileSync(await (await fromPanel(page, 'share-csv')).path(), 'utf8');
  const rows = parseCsv(csv);
  expect(rows[0]).toEqual(RESULTS_HEADER);
  for (const [id, r] of Object.entries(s.solve.result.elements as Record<string, any>)) {
    if (!('current' in r)) continue;
    const row = rows.find((x) => x[0] === id)!;
    const at = (c: string) => Number(row[RESULTS_HEADER.indexOf(c)]);
    expect([at('I_re'), at('I_im'), at('P_W')]).toEqual([r.current.re, r.current.im, r.power.watts]); // the worker's doubles, round-trip exact
  }

  const png = readFileSync(await (await fromPanel(page, 'share-png')).path());
  expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // the PNG signature (RFC 2083 §3.1)
  const box = (await page.getByTestId('sheet-canvas').boundingBox())!;
  // IHDR width and height (RFC 2083 §4.1.1): the drawing cropped from the canvas as shown, at device pixel ratio 1
  const [w, h] = [png.readUInt32BE(16), png.readUInt32BE(20)];
  expect(w).toBeLessThanOrEqual(Math.round(box.width));
  expect(h).toBeLessThanOrEqual(Math.round(box.height));
  expect(w).toBeGreaterThan(300);
  expect(h).toBeGreaterThan(150);
  const pngPath = info.outputPath('canvas.png');
  (await import('node:fs')).writeFileSync(pngPath, png);
  await info.attach('canvas-png', { path: pngPath, contentType: 'image/png' });

  // print: our Print command fills the print-only sheet, then asks the browser (stubbed here) to print
  await page.evaluate(() => { (window as any).__printed = 0; window.print = () => { (window as any).__printed++; }; });
  await page.getByTestId('share-print').click();
  await expect.poll(() => page.evaluate(() => (window as any).__printed)).toBe(1);
  // and by key, as the Print sheet command (Ctrl+P)
  await page.keyboard.press('Escape');
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Control+p');
  await expect.poll(() => page.evaluate(() => (window as any).__printed)).toBe(2);
  const exported = readFileSync(await (await fromPanel(page, 'share-svg')).path(), 'utf8');
  await page.keyboard.press('Escape');
  await page.emulateMedia({ media: 'print' });
  await expect(page.locator('#root')).toBeHidden();
  await expect(page.locator('.print-sheet svg')).toBeVisible();
  const printed = await page.locator('.print-sheet svg g#results').evaluate((g) => [...g.querySelectorAll('text')].map((t) => t.textContent));
  const fromFile = await page.evaluate((text) => {
    const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
    return [...doc.querySelectorAll('g#results text')].map((t) => t.textContent);
  }, exported);
  expect(printed).toEqual(fromFile); // the print shows the same table as the SVG file
  await shot(page, info, 'print-media');
  const pdfBytes = await page.pdf({ preferCSSPageSize: true });
  (await import('node:fs')).writeFileSync(info.outputPath('a4.pdf'), pdfBytes);
  await info.attach('a4-pdf', { path: info.outputPath('a4.pdf'), contentType: 'application/pdf' });
  const pdf = pdfBytes.toString('latin1');
  // A4 landscape is 297 mm × 210 mm = 841.9 pt × 595.3 pt (72 pt per inch); Chromium writes it rounded to its own float
  expect(pdf).toMatch(/\/MediaBox\s*\[\s*0 0 841\.9\d* 59[45]\.\d+\s*\]/);
  expect(pdf.match(/\/Type\s*\/Page\b(?!s)/g)).toHaveLength(1); // one sheet of paper
  await page.emulateMedia({ media: 'screen' });
  await expect(page.locator('#root')).toBeVisible();

  // on Letter paper too: the page is set to Letter landscape and the sheet still takes one page
  await page.getByTestId('share-open').click();
  await page.getByRole('radio', { name: 'Letter' }).check();
  await page.getByTestId('share-print').click();
  await expect.poll(() => page.evaluate(() => (window as any).__printed)).toBe(3);
  await expect(page.locator('.print-sheet svg')).toHaveAttribute('width', '258.4mm'); // 279.4 mm (ANSI Letter) less 2 × 10.5 mm
  await page.emulateMedia({ media: 'print' });
  const letter = await page.pdf({ preferCSSPageSize: true });
  await page.emulateMedia({ media: 'screen' });
  (await import('node:fs')).writeFileSync(info.outputPath('letter.pdf'), letter);
  await info.attach('letter-pdf', { path: info.outputPath('letter.pdf'), contentType: 'application/pdf' });
  const text = letter.toString('latin1');
  expect(text.match(/\/Type\s*\/Page\b(?!s)/g)).toHaveLength(1);
  // the page box is 11 in × 8.5 in = 792 pt × 612 pt (PDF units, 72 per inch)
  expect(text).toMatch(/\/MediaBox\s*\[\s*0 0 792 612\s*\]/);
});
