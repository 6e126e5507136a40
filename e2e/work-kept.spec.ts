import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';

/**
 * Work is never lost or silently overwritten: a second tab on the same sheet
 * is read-only until it takes over or keeps a copy; a solve worker that stops
 * answering is replaced while the readings are greyed, and a solver that
 * keeps failing is reported; full storage, an unreadable kept sheet and a
 * damaged list of sheets are each said and survived.
 */

const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());
const stored = (page: Page, id: string) => page.evaluate((k) => localStorage.getItem(`coilwright:sheet:${k}`), id);

async function solved(page: Page) {
  await page.getByTestId('sheet-canvas').waitFor();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
}

/** Sets the sheet title through the details panel, as a user does. */
async function typeTitle(page: Page, title: string) {
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Escape');
  await page.getByTestId('sheet-title').fill(title);
  await page.getByTestId('sheet-title').press('Enter');
}

function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  return errors;
}

test('a second tab on the same sheet opens read-only, follows the first, and can take over or keep a copy', async ({ context }) => {
  const a = await context.newPage();
  await a.goto('/');
  await solved(a);
  await typeTitle(a, 'Bench A');
  const id = (await state(a)).sheetId;
  await expect.poll(async () => JSON.parse((await stored(a, id)) ?? '{}').title).toBe('Bench A');

  const b = await context.newPage();
  await b.goto('/');
  await solved(b);
  await expect(b.getByTestId('read-only-banner')).toHaveAttribute('data-why', 'elsewhere');
  expect((await state(b)).sheetId).toBe(id);
  await typeTitle(b, 'Typed in B');
  await expect(b.locator('.notice-error')).toContainText('read-only in this tab');
  expect((await state(b)).sheet.title).toBe('Bench A');
  expect(JSON.parse((await stored(b, id))!).title).toBe('Bench A'); // nothing of B was saved

  // the first tab edits: the second follows what it saves
  await typeTitle(a, 'Bench A, second edit');
  await expect.poll(async () => (await state(b)).sheet.title).toBe('Bench A, second edit');

  // the second takes over: it edits, the first turns read-only
  await b.getByTestId('take-over').click();
  await expect(b.getByTestId('read-only-banner')).toHaveCount(0);
  await expect(a.getByTestId('read-only-banner')).toHaveAttribute('data-why', 'taken');
  await typeTitle(b, 'Bench B');
  await expect.poll(async () => JSON.parse((await stored(b, id))!).title).toBe('Bench B');
  await expect.poll(async () => (await state(a)).sheet.title).toBe('Bench B');
  await typeTitle(a, 'Typed in A while read-only');
  await expect(a.locator('.notice-error')).toContainText('read-only in this tab');

  // the first keeps a copy: a sheet of its own, edited and saved there; the shared one keeps B's work
  await a.getByTestId('keep-copy').click();
  await expect(a.getByTestId('read-only-banner')).toHaveCount(0);
  const copy = (await state(a)).sheetId;
  expect(copy).not.toBe(id);
  await typeTitle(a, 'Bench A, my variant');
  await expect.poll(async () => JSON.parse((await stored(a, copy)) ?? '{}').title).toBe('Bench A, my variant');
  expect(JSON.parse((await stored(a, id))!).title).toBe('Bench B');
  await expect(b.getByTestId('read-only-banner')).toHaveCount(0);
});

test('a solve worker that stops answering is replaced; a solver that keeps failing is reported, greyed, and retried', async ({ page }) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await solved(page);
  const setFrequency = async (text: string) => {
    await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('Escape');
    await page.getByTestId('sheet-frequency').fill(text);
    await page.getByTestId('sheet-frequency').press('Enter');
  };

  // the worker dies without a word; the next edit is still solved, by a new worker
  await page.evaluate(() => (window as any).__coilwright.test.stopSolver());
  await setFrequency('60');
  await expect.poll(async () => (await state(page)).solve.result?.frequencyHz, { timeout: 30_000 }).toBe(60);
  await expect(page.locator('section.readings')).not.toHaveClass(/stale/);

  // now every new worker hangs: the readings grey, and after three restarts the editor says so
  await page.evaluate(() => {
    const t = (window as any).__coilwright.test;
    t.hangSolvers(true);
    t.watchdog.staleAfterMs = 100;
    t.watchdog.restartAfterMs = 300;
    t.stopSolver();
  });
  await setFrequency('70');
  await expect(page.locator('section.readings')).toHaveClass(/stale/);
  await expect(page.getByTestId('solver-stuck')).toContainText('The solver stopped answering');
  expect((await state(page)).solve.result.frequencyHz).toBe(60); // the last good values, shown greyed
  await expect(page.getByTestId('convention')).toContainText('70 Hz');

  // the fault is gone: Try again solves the latest edit
  await page.evaluate(() => {
    const t = (window as any).__coilwright.test;
    t.hangSolvers(false);
    t.watchdog.staleAfterMs = 1500;
    t.watchdog.restartAfterMs = 8000;
  });
  await page.getByTestId('solver-retry').click();
  await expect.poll(async () => (await state(page)).solve.result?.frequencyHz, { timeout: 30_000 }).toBe(70);
  await expect(page.getByTestId('solver-stuck')).toHaveCount(0);
  await expect(page.locator('section.readings')).not.toHaveClass(/stale/);
  expect(errors).toEqual([]);
});

test('with browser storage full, the symbol standard still switches on screen and says it is not kept', async ({ page }) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await solved(page);
  const filled = await page.evaluate(() => {
    let n = 0;
    for (let size = 1 << 20; size >= 1; size >>= 1) {
      const chunk = 'x'.repeat(size);
      try {
        for (;;) localStorage.setItem(`filler:${n++}`, chunk);
      } catch {
        /* full at this size: try smaller ones */
      }
    }
    return n;
  });
  expect(filled).toBeGreaterThan(0);
  const draws = await page.evaluate(() => (window as any).__coilwright.sheetDraws.draws);
  await page.locator('[data-command="symbols"]').click();
  await expect(page.locator('[data-command="symbols"]')).toHaveText('Symbols: IEEE 315');
  await expect(page.locator('.notice-error')).toContainText('for this visit only: the browser could not keep the choice (its storage is full)');
  expect((await state(page)).symbols).toBe('ieee');
  await expect.poll(() => page.evaluate(() => (window as any).__coilwright.sheetDraws.draws)).toBeGreaterThan(draws); // the sheet was drawn again, to the new standard
  await page.locator('[data-command="symbols"]').click();
  await expect(page.locator('[data-command="symbols"]')).toHaveText('Symbols: IEC 60617');
  expect(errors).toEqual([]);
});

test('an unreadable kept sheet is said, kept as stored and offered for download; a damaged list is rebuilt', async ({ page }) => {
  await page.goto('/');
  await solved(page);
  await typeTitle(page, 'Alpha');
  const alpha = (await state(page)).sheetId;
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.getByRole('menuitem', { name: /New empty sheet/ }).click();
  await typeTitle(page, 'Beta');
  const beta = (await state(page)).sheetId;
  await expect.poll(async () => JSON.parse((await stored(page, beta)) ?? '{}').title).toBe('Beta');

  // the list of kept sheets is damaged: both still show, rebuilt from what is stored
  await page.evaluate(() => localStorage.setItem('coilwright:library', '[{"id": 3, "oops'));
  await page.reload();
  await page.getByTestId('sheet-canvas').waitFor(); // Beta, an empty sheet: nothing to solve
  await page.getByRole('button', { name: /Sheets/ }).click();
  await expect(page.getByRole('menuitem', { name: /Alpha/ })).toBeVisible();
  await expect(page.getByRole('menuitem', { name: /Beta/ })).toBeVisible();
  await page.keyboard.press('Escape');

  // the sheet last worked on cannot be read: the demo opens beside it, the reason is said, its text stays and downloads
  const broken = '{"schema": "coilwright.sheet/4", "title": "Beta", "frequencyHz": 50, "parts": [{"kind": "resistor"}]}';
  await page.evaluate(([id, text]) => localStorage.setItem(`coilwright:sheet:${id}`, text), [beta, broken]);
  await page.reload();
  await solved(page);
  await expect(page.getByTestId('unreadable-sheet')).toContainText('“Beta”');
  await expect(page.getByTestId('unreadable-sheet')).toContainText('Sheet is damaged: parts[0]');
  expect((await state(page)).sheetId).not.toBe(beta);
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('unreadable-download').click()]);
  expect(readFileSync((await dl.path())!, 'utf8')).toBe(broken);
  await expect.poll(() => stored(page, beta)).toBe(broken); // never overwritten
  expect(JSON.parse((await stored(page, alpha))!).title).toBe('Alpha');
});
