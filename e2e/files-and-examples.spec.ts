import { expect, test } from '@playwright/test';
import { writeFileSync } from 'node:fs';
import { clickSheet, shot } from './helpers';

const partsCount = (page: import('@playwright/test').Page) => page.evaluate(() => (window as any).__coilwright.state().sheet.parts.length as number);

async function openFile(page: import('@playwright/test').Page, path: string) {
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: /^Open file/ }).click()]);
  await chooser.setFiles(path);
}

test('examples are one click away; graph models open; foreign and newer files are refused', async ({ page }, info) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').waitFor();

  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect(page.getByTestId('convention')).toContainText('85 kHz');
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Rbat"]')).toBeVisible();
  await shot(page, info, 'wireless-example');

  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="current-transformer"]').click();
  // 100 A through one turn, 1000 turns on the secondary: about 0.1 A in the burden (turns ratio, from memory)
  await expect.poll(async () => Number(await page.locator('[data-testid="readings-parts"] tr[data-name="Rburden"] td[data-col="i"]').getAttribute('data-mag'))).toBeGreaterThan(0.095);
  await shot(page, info, 'current-transformer-example');

  // the annotated picture saves as SVG and opens again as the same sheet
  const ctParts = await partsCount(page);
  const [picture] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /^Save picture/ }).click()]);
  expect(picture.suggestedFilename()).toMatch(/\.svg$/);
  const svgPath = info.outputPath('current-transformer.svg');
  await picture.saveAs(svgPath);
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await openFile(page, svgPath);
  await expect(page.getByTestId('convention')).toContainText('50 Hz');
  expect(await partsCount(page)).toBe(ctParts);

  // the example model of the graph-model contract opens, laid out simply, and solves
  const graph = info.outputPath('contract.json');
  writeFileSync(graph, JSON.stringify({
    schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd',
    elements: [
      { id: 'Vin', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 230, phaseDeg: 0 },
      { id: 'Rw', kind: 'resistor', nodes: ['a', 'b'], ohms: 0.4 },
      { id: 'Lp', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.8, dot: 'first' },
      { id: 'Ls', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.05, dot: 'first' },
      { id: 'Cs', kind: 'capacitor', nodes: ['c', 'd'], farads: 2.2e-6 },
      { id: 'Rl', kind: 'resistor', nodes: ['d', 'gnd'], ohms: 12 },
      { id: 'Iaux', kind: 'current-source', nodes: ['gnd', 'd'], magnitude: 0.1, phaseDeg: -30 },
      { id: 'Tx', kind: 'ideal-transformer', nodes: ['d', 'gnd', 'e', 'gnd'], ratio: 4 },
      { id: 'Re', kind: 'resistor', nodes: ['e', 'gnd'], ohms: 100 },
    ],
    couplings: [{ id: 'Kps', windings: ['Lp', 'Ls'], k: 0.92 }],
  }));
  await openFile(page, graph);
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Tx primary"]')).toBeVisible();
  await expect(page.locator('[data-testid="readings-nodes"] tr[data-name="e"]')).toBeVisible();
  await shot(page, info, 'graph-model-opened');
  const kept = await partsCount(page);

  const newer = info.outputPath('newer.json');
  writeFileSync(newer, JSON.stringify({ schema: 'coilwright.sheet/42', parts: [] }));
  await openFile(page, newer);
  await expect(page.locator('.notice-error')).toContainText('newer than this editor reads');
  expect(await partsCount(page)).toBe(kept);

  const foreign = info.outputPath('foreign.json');
  writeFileSync(foreign, JSON.stringify({ format: 'something else', items: [] }));
  await openFile(page, foreign);
  await expect(page.locator('.notice-error')).toContainText('no "schema" field');
  expect(await partsCount(page)).toBe(kept);
  await shot(page, info, 'foreign-file-refused');
});

test('duplicate by key; a duplicate designator is refused with a message', async ({ page }, info) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').waitFor();
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="isolation"]').click();
  const before = await partsCount(page);
  const r1 = await page.evaluate(() => (window as any).__coilwright.state().sheet.parts.find((p: any) => p.ref === 'Rp'));
  await clickSheet(page, r1.x, r1.y);
  await page.keyboard.press('Control+d');
  expect(await partsCount(page)).toBe(before + 1);
  await expect(page.getByTestId('field-ref')).toHaveValue('R1'); // the first free R number (the demo's resistors have names of their own)
  await page.getByTestId('field-ref').fill('Rs');
  await page.getByTestId('field-ref').press('Enter');
  await expect(page.locator('.field-error')).toContainText('Rs is already used on this sheet');
  await shot(page, info, 'duplicate-designator-refused');
  await page.keyboard.press('Escape');
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Control+z');
  expect(await partsCount(page)).toBe(before);
});
