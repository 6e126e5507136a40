import { expect, test, type Page } from '@playwright/test';
import { readFileSync, writeFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { shot } from './helpers';

/** Hostile text stays text, in the app, the SVG and a link; broken links and oversized files are refused and the sheet kept. */

const HOSTILE = '<script>alert(1)</script> & "q" ]]>';
const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());
const storageOf = (page: Page) => page.evaluate(() => JSON.stringify(Object.entries(localStorage).sort()));

async function ready(page: Page, url = '/') {
  await page.goto(url);
  await page.getByTestId('sheet-canvas').waitFor();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
}

test('a hostile title appears literally in the app, the SVG and a shared link', async ({ page, context }, info) => {
  const dialogs: string[] = [];
  context.on('dialog', (d) => { dialogs.push(d.message()); void d.dismiss(); });
  await ready(page);
  const scripts = await page.locator('script').count();
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.getByTestId('sheet-title').fill(HOSTILE);
  await page.getByTestId('sheet-title').press('Enter');
  await expect(page.locator('.sheet-title')).toHaveText(HOSTILE); // shown as typed (React writes text, never markup)
  await expect(page.locator('.badge-sub')).toContainText(HOSTILE);
  expect(await page.locator('script').count()).toBe(scripts);
  await shot(page, info, 'hostile-title-in-app');

  await page.getByTestId('share-open').click();
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-svg').click()]);
  const file = info.outputPath('hostile.svg');
  await dl.saveAs(file);
  const svg = readFileSync(file, 'utf8');
  expect(svg).not.toContain('<script'); // escaped: &lt;script&gt;
  const view = await context.newPage();
  await view.goto(pathToFileURL(file).href);
  const facts = await view.evaluate(() => ({
    title: document.querySelector('title')?.textContent,
    scripts: document.getElementsByTagName('script').length,
    parserError: !!document.querySelector('parsererror'),
    texts: [...document.querySelectorAll('text')].map((t) => t.textContent ?? ''),
  }));
  expect(facts).toMatchObject({ title: HOSTILE, scripts: 0, parserError: false });
  expect(facts.texts.some((t) => t.includes(HOSTILE))).toBe(true); // the title block prints it literally
  await view.screenshot({ path: info.outputPath('hostile-svg.png') });
  await info.attach('hostile-svg', { path: info.outputPath('hostile-svg.png'), contentType: 'image/png' });

  // print path: the same text, still text
  await page.evaluate(() => { window.print = () => undefined; });
  await page.getByTestId('share-print').click();
  await expect.poll(() => page.locator('.print-sheet title').first().textContent()).toBe(HOSTILE);
  expect(await page.locator('.print-sheet script').count()).toBe(0);

  // through a link and back
  const url = await page.getByTestId('share-link').inputValue();
  const other = await context.newPage();
  await other.goto(url);
  await expect(other.getByTestId('visit-title')).toHaveText(HOSTILE);
  await expect(other.locator('.sheet-title')).toHaveText(HOSTILE);
  await shot(other, info, 'hostile-title-via-link');
  expect(dialogs).toEqual([]); // no script ever ran
});

test('broken links are refused with the reason; the sheet and storage stay', async ({ page }, info) => {
  await ready(page);
  // an edit, so that the sheet is the user's own and autosaved
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.getByTestId('sheet-title').fill('Mine, kept');
  await page.getByTestId('sheet-title').press('Enter');
  await expect.poll(() => page.evaluate(() => localStorage.getItem('coilwright:current'))).not.toBeNull();
  await page.getByTestId('share-open').click();
  const good = await page.getByTestId('share-link').inputValue();
  const sheet = (await state(page)).sheet;
  await page.reload();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  const before = await storageOf(page);

  const cases: [string, RegExp][] = [
    [good.slice(0, good.length - 30), /cut short|damaged/],
    [good.replace(/#sheet=z1\.(.{10})./, '#sheet=z1.$1*'), /characters a sheet link never has/],
    [good.replace('#sheet=z1.', '#sheet=z7.'), /made by a newer Coilwright/],
    [`${good.split('#')[0]}#sheet=z1.${'A'.repeat(40_000)}`, /too long/],
  ];
  for (const [url, why] of cases) {
    await page.goto(url);
    await expect(page.locator('.notice-error')).toContainText('Could not open the shared link');
    await expect(page.locator('.notice-error')).toContainText(why);
    await expect(page.getByTestId('visit-banner')).toHaveCount(0);
    expect((await state(page)).sheet).toEqual(sheet); // the sheet the user had
    expect(await storageOf(page)).toBe(before);
  }
  await shot(page, info, 'broken-link-refused');
});

test('an oversized or truncated file is refused and the sheet kept', async ({ page }, info) => {
  await ready(page);
  const sheet = (await state(page)).sheet;
  const open = async (path: string) => {
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: /^Open file/ }).click()]);
    await chooser.setFiles(path);
  };
  const big = info.outputPath('huge.coilwright.json');
  writeFileSync(big, JSON.stringify({ ...sheet, title: 'x'.repeat(6 * 1024 * 1024) }));
  await open(big);
  await expect(page.locator('.notice-error')).toContainText('huge.coilwright.json is too large to be a sheet (6 MB; a sheet file is at most 5 MB)');
  expect((await state(page)).sheet).toEqual(sheet);

  const cut = info.outputPath('cut.coilwright.json');
  const text = JSON.stringify(sheet, null, 2);
  writeFileSync(cut, text.slice(0, text.length >> 1));
  await open(cut);
  await expect(page.locator('.notice-error')).toContainText('cut.coilwright.json is not a Coilwright file: it is not valid JSON');
  await expect(page.locator('.notice-error')).toContainText('The current sheet is unchanged');
  expect((await state(page)).sheet).toEqual(sheet);
  await shot(page, info, 'oversized-file-refused');
});
