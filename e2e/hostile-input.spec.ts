import { expect, test, type Page } from '@playwright/test';
import { readFileSync, writeFileSync } from 'node:fs';
import { encodeSheetPayload } from '../src/model/link';
import { parseCsv } from '../src/export/csv';
import type { Sheet } from '../src/model/sheet';

/**
 * What a hostile link or file, or a careless name, does to the editor: a far
 * coordinate or a huge title is refused in one line naming the field and the
 * page stays usable; names such as "__proto__" are names like any other;
 * names and titles built as spreadsheet formulas stay text in every CSV; a
 * bidirectional override in an imported name is refused.
 */

const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());
const example = (file: string): Sheet => JSON.parse(readFileSync(`examples/sheets/${file}.json`, 'utf8'));

/** Page errors (uncaught exceptions) seen during a test. */
function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  return errors;
}

async function solved(page: Page) {
  await page.getByTestId('sheet-canvas').waitFor();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
}

async function openFile(page: Page, path: string) {
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: /^Open file/ }).click()]);
  await chooser.setFiles(path);
}

/** The page still answers: the sheet menu opens and closes. */
async function stillUsable(page: Page) {
  await page.getByRole('button', { name: /Sheets/ }).click();
  await expect(page.getByRole('menuitem', { name: /New empty sheet/ })).toBeVisible();
  await page.keyboard.press('Escape');
}

test('a link with a part at x = 1e20, or with a title of megabytes, is refused naming the field; the page stays usable', async ({ page }) => {
  const errors = watchErrors(page);
  const far = example('isolation-transformer-230v');
  far.parts[0].x = 1e20;
  const farLink = await encodeSheetPayload(far);
  const wide = example('isolation-transformer-230v');
  wide.title = 'x'.repeat(3_000_000);
  const wideLink = await encodeSheetPayload(wide);
  console.log(`links of ${farLink.length} and ${wideLink.length} characters`);

  await page.goto(`/#sheet=${farLink}`);
  await expect(page.locator('.notice-error')).toContainText('parts[0].x: must lie between -1000000 and 1000000');
  await expect(page.locator('.notice-error')).toContainText('The current sheet is unchanged');
  await stillUsable(page);

  await page.goto('/');
  await page.goto(`/#sheet=${wideLink}`);
  await expect(page.locator('.notice-error')).toContainText('title: is 3000000 characters long; a title has at most 200');
  await expect(page.getByTestId('visit-banner')).toHaveCount(0);
  await stillUsable(page);
  expect(errors).toEqual([]);
});

test('a file with a far coordinate or a bidirectional override in a name is refused; the sheet stays', async ({ page }, info) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await solved(page);
  const before = (await state(page)).sheet;
  const far = example('isolation-transformer-230v');
  far.wires[0].pts[1] = -4e15;
  writeFileSync(info.outputPath('far.json'), JSON.stringify(far));
  await openFile(page, info.outputPath('far.json'));
  await expect(page.locator('.notice-error')).toContainText('wires[0].pts[1]: must lie between -1000000 and 1000000');
  // U+202E RIGHT-TO-LEFT OVERRIDE would show "burden‮evil" reversed (Unicode bidirectional algorithm, UAX #9)
  const bidi = example('current-transformer-burden');
  const label = bidi.parts.findIndex((p) => p.kind === 'label');
  bidi.parts[label].name = 'burden\u202Elive';
  writeFileSync(info.outputPath('bidi.json'), JSON.stringify(bidi));
  await openFile(page, info.outputPath('bidi.json'));
  await expect(page.locator('.notice-error')).toContainText(`parts[${label}].name: holds a bidirectional control (U+202E)`);
  expect((await state(page)).sheet).toEqual(before);
  await stillUsable(page);
  expect(errors).toEqual([]);
});

test('"__proto__" as a node name and as a designator shows in readings, overlay and both CSVs', async ({ page, context }) => {
  await context.grantPermissions(['clipboard-read', 'clipboard-write']);
  const errors = watchErrors(page);
  await page.goto('/');
  await solved(page);
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="current-transformer"]').click();
  await expect(page.locator('[data-testid="readings-nodes"] tr[data-name="burden"]')).toBeVisible();

  // the node label is the last part of the sheet: step the selection to it
  await page.getByTestId('sheet-canvas').focus();
  const parts = (await state(page)).sheet.parts.length;
  for (let i = 0; i < parts; i++) await page.keyboard.press(']');
  await expect(page.getByTestId('field-name')).toHaveValue('burden');
  await page.getByTestId('field-name').fill('__proto__');
  await page.getByTestId('field-name').press('Enter');
  await expect(page.locator('[data-testid="readings-nodes"] tr[data-name="__proto__"]')).toBeVisible();

  await page.locator('[data-testid="readings-parts"] tr[data-name="Rsec"] .row-btn').click();
  await page.getByTestId('field-ref').fill('__proto__');
  await page.getByTestId('field-ref').press('Enter');
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="__proto__"]')).toBeVisible();
  // the overlay went on drawing for the latest edit: its tags name the node
  await expect.poll(() => page.evaluate(() => { const w = window as any; return w.__coilwright.overlay.seq === w.__coilwright.state().solve.seq; })).toBe(true);
  // read in the page: the result's own keys (a copy out of the page would turn "__proto__" back into a prototype)
  const keys = await page.evaluate(() => { const r = (window as any).__coilwright.state().solve.result; return [Object.keys(r.nodes), Object.keys(r.elements)]; });
  expect(keys[0]).toContain('__proto__');
  expect(keys[1]).toContain('__proto__');

  await page.locator('[data-command="copy-readings"]').click();
  await expect.poll(() => page.evaluate(() => navigator.clipboard.readText())).toContain('"__proto__","node"');
  expect(await page.evaluate(() => navigator.clipboard.readText())).toContain('"__proto__","part"');
  await page.getByTestId('share-open').click();
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-csv').click()]);
  const rows = parseCsv(readFileSync((await dl.path())!, 'utf8'));
  expect(rows.filter((r) => r[0] === '__proto__').map((r) => r[1]).sort()).toEqual(['node', 'resistor']);
  expect(errors).toEqual([]);
});

test('a title and designators built as spreadsheet formulas stay text in the results CSV and the copied readings', async ({ page, context }) => {
  await context.grantPermissions(['clipboard-read', 'clipboard-write']);
  await page.goto('/');
  await solved(page);
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Escape');
  await page.getByTestId('sheet-title').fill('Bench,=1+1');
  await page.getByTestId('sheet-title').press('Enter');
  await page.locator('[data-testid="readings-parts"] tr[data-name="Rp"] .row-btn').click();
  await page.getByTestId('field-ref').fill('=HYPERLINK("http://example.invalid","x")');
  await page.getByTestId('field-ref').press('Enter');
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name^="=HYPERLINK"]')).toBeVisible();

  await page.getByTestId('share-open').click();
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-csv').click()]);
  const results = readFileSync((await dl.path())!, 'utf8');
  await page.keyboard.press('Escape');
  await page.locator('[data-command="copy-readings"]').click();
  await expect.poll(() => page.evaluate(() => navigator.clipboard.readText())).toContain('Coilwright readings');
  const copied = await page.evaluate(() => navigator.clipboard.readText());
  for (const text of [results, copied]) {
    // every line split as a spreadsheet splits it (RFC 4180): no text cell begins with = + - @ tab or CR (OWASP, CSV Injection)
    for (const line of text.split(/\r?\n/).filter(Boolean)) {
      for (const cell of parseCsv(line.replace(/^#/, 'comment'))[0]) {
        if (!Number.isFinite(Number(cell))) expect(cell, line).not.toMatch(/^[=+\-@\t\r]/);
      }
    }
    expect(parseCsv(text.split(/\r?\n/)[0].replace(/^#/, 'x'))[0][1]).toBe('Bench,=1+1');
    expect(parseCsv(text).some((r) => r[0] === `'=HYPERLINK("http://example.invalid","x")`)).toBe(true);
  }
});
