import { expect, test, type Page } from '@playwright/test';
import { writeFileSync } from 'node:fs';
import { shot } from './helpers';

/**
 * A link carries the sheet: opened in another page it shows the sheet solved,
 * and the sheets kept in the browser stay exactly as they were until the
 * user keeps the shared one.
 */

const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());
const storageOf = (page: Page) => page.evaluate(() => JSON.stringify(Object.entries(localStorage).sort()));

async function setTitle(page: Page, title: string) {
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Escape');
  await page.getByTestId('sheet-title').fill(title);
  await page.getByTestId('sheet-title').press('Enter');
  await expect.poll(async () => (await state(page)).sheet.title).toBe(title);
}

test('copy a link, open it in a new page: solved, autosave untouched until Keep', async ({ page, context }, info) => {
  await context.grantPermissions(['clipboard-read', 'clipboard-write']);
  await page.goto('/');
  await page.getByTestId('sheet-canvas').waitFor();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await setTitle(page, 'My own bench sheet');
  const mine = await state(page);

  // the sheet to share: the wireless example, under its own title
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await setTitle(page, 'Pair for review');
  const shared = (await state(page)).sheet;
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.getByRole('menuitem', { name: /My own bench sheet/ }).click();
  await expect.poll(async () => (await state(page)).sheetId).toBe(mine.sheetId);
  // share the wireless sheet from its own page state: switch back to it and copy its link
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.getByRole('menuitem', { name: /Pair for review/ }).click();
  await page.getByTestId('share-open').click();
  await expect(page.getByTestId('share-link')).toHaveValue(/#sheet=z1\./);
  await page.getByTestId('share-copy-link').click();
  const url = await page.getByTestId('share-link').inputValue();
  expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(url);
  await shot(page, info, 'share-link-made');
  // leave the user's own sheet open, then close this page: what storage holds now is what must stay
  await page.keyboard.press('Escape');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.getByRole('menuitem', { name: /My own bench sheet/ }).click();
  await page.waitForTimeout(300);
  const before = await storageOf(page);
  await page.close();

  const other = await context.newPage();
  await other.goto(url);
  await expect(other.getByTestId('visit-banner')).toBeVisible();
  await expect(other.getByTestId('visit-title')).toHaveText('Pair for review');
  await expect.poll(async () => (await state(other)).solve.status).toBe('solved');
  const seen = await state(other);
  expect(seen.sheet).toEqual(shared); // sheet → link → sheet, identical
  expect(seen.solve.result.frequencyHz).toBe(shared.frequencyHz); // solved at the shared sheet's own frequency
  await expect(other.locator('[data-testid="readings-parts"] tr[data-name="Rbat"]')).toBeVisible();
  await shot(other, info, 'shared-sheet-opened');
  await other.waitForTimeout(300);
  expect(await storageOf(other)).toBe(before); // not a byte of the kept sheets changed

  // dismiss: the user's own sheet is back, storage still as it was
  await other.getByTestId('visit-dismiss').click();
  await expect(other.getByTestId('visit-banner')).toBeHidden();
  await expect.poll(async () => (await state(other)).sheet.title).toBe('My own bench sheet');
  await other.waitForTimeout(300);
  expect(await storageOf(other)).toBe(before);
  expect(new URL(other.url()).hash).toBe('');

  // open it again and keep it: now it is among the browser's sheets and opens on the next visit
  await other.goto(url);
  await expect(other.getByTestId('visit-banner')).toBeVisible();
  await other.getByTestId('visit-keep').click();
  await expect(other.getByTestId('visit-banner')).toBeHidden();
  await expect.poll(() => storageOf(other)).not.toBe(before);
  const keptId = (await state(other)).sheetId;
  await expect.poll(() => other.evaluate((id) => localStorage.getItem(`coilwright:sheet:${id}`) !== null, keptId)).toBe(true);
  await other.reload();
  await expect.poll(async () => (await state(other)).sheet.title).toBe('Pair for review');
  await expect(other.getByTestId('visit-banner')).toBeHidden();
  await shot(other, info, 'shared-sheet-kept');
});

test('a sheet too large for a link says so and offers the file', async ({ page }, info) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').waitFor();
  // 500 node labels with 100 random characters each: about 50 KB of text that does not compress below 32 KB
  let x = 7;
  const rnd = () => ((x = (x * 48271) % 2147483647) % 36).toString(36);
  const parts = Array.from({ length: 500 }, (_, i) => ({ id: `part:l${i}`, kind: 'label', x: (i % 25) * 80, y: Math.floor(i / 25) * 40, rot: 0, mirror: false, ref: '', name: Array.from({ length: 100 }, rnd).join('') }));
  const file = info.outputPath('big.coilwright.json');
  writeFileSync(file, JSON.stringify({ schema: 'coilwright.sheet/4', title: 'Big', frequencyHz: 50, amplitudes: 'rms', parts, wires: [], couplings: [] }));
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: /^Open file/ }).click()]);
  await chooser.setFiles(file);
  await expect.poll(async () => (await state(page)).sheet.title).toBe('Big');
  await page.getByTestId('share-open').click();
  await expect(page.getByTestId('share-link-problem')).toContainText(/too large for a link \(\d+(\.\d)? KB; a link holds up to 32 KB\)/);
  await expect(page.getByTestId('share-link')).toHaveCount(0);
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-save-file').click()]);
  expect(dl.suggestedFilename()).toBe('Big.coilwright.json');
  await shot(page, info, 'link-too-large');
});
