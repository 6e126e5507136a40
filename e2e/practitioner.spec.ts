import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { shot } from './helpers';

type Box = { x0: number; y0: number; x1: number; y1: number; text: string };
const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());

/** Press `key` until the wire tool's pin cursor is on `ref`'s pin `pin` (at most once round every pin). */
async function cursorTo(page: Page, ref: string, pin: number) {
  const want = await page.evaluate(([r, i]) => (window as any).__coilwright.pin(r, i), [ref, pin] as const);
  for (let n = 0; n < 60; n++) {
    const at = (await state(page)).pinCursor;
    if (at && at.x === want.x && at.y === want.y) return;
    await page.keyboard.press(']');
  }
  throw new Error(`the pin cursor never reached ${ref} pin ${pin}`);
}

async function wireFromKeys(page: Page, a: [string, number], b: [string, number]) {
  await cursorTo(page, ...a);
  await page.keyboard.press('Enter');
  await cursorTo(page, ...b);
  await page.keyboard.press('Enter');
}

test('the whole job from the keyboard alone: draw, couple, set values, solve, export', async ({ page }, info) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto('/');
  await expect(page.getByTestId('convention')).toContainText('50 Hz');
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Alt+n');
  // parts from their shelf keys; Enter drops each at a free spot beside the last one
  for (const key of ['4', '2', '2', '1', '7']) {
    await page.keyboard.press(key);
    await page.keyboard.press('Enter');
  }
  const placed = (await state(page)).sheet.parts;
  expect(placed.map((p: any) => p.ref)).toEqual(['V1', 'L1', 'L2', 'R1', '']);
  // no two parts on top of each other
  const xs = new Set(placed.map((p: any) => `${p.x},${p.y}`));
  expect(xs.size).toBe(placed.length);
  // the ground has no designator: give the wiring helper a name for it
  await page.evaluate(() => {
    const s = (window as any).__coilwright;
    const orig = s.pin;
    s.pin = (ref: string, i: number) => (ref === 'GND' ? (() => { const g = s.state().sheet.parts.find((p: any) => p.kind === 'ground'); return { x: g.x, y: g.y }; })() : orig(ref, i));
  });
  // wires: pick a pin, Enter, pick the target pin, Enter
  await page.keyboard.press('j');
  await wireFromKeys(page, ['V1', 0], ['L1', 0]);
  await wireFromKeys(page, ['V1', 1], ['GND', 0]);
  await wireFromKeys(page, ['L1', 1], ['GND', 0]);
  await wireFromKeys(page, ['L2', 0], ['R1', 0]);
  await wireFromKeys(page, ['L2', 1], ['R1', 1]);
  await page.keyboard.press('Escape');
  expect((await state(page)).sheet.wires).toHaveLength(5);
  // couple L1 and L2: select the next items with ] and }, then C; V types the value of k
  await page.keyboard.press('Escape');
  await page.keyboard.press(']');
  await page.keyboard.press(']');
  await page.keyboard.press('}');
  await page.keyboard.press('c');
  expect((await state(page)).sheet.couplings).toHaveLength(1);
  await page.keyboard.press('v');
  await expect(page.getByTestId('field-coupling')).toBeFocused();
  await page.keyboard.type('0.95');
  await page.keyboard.press('Enter');
  // the source's value: step back to V1 and type 230
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Escape');
  await page.keyboard.press(']');
  await page.keyboard.press('v');
  await expect(page.getByTestId('field-value')).toBeFocused();
  await page.keyboard.type('230');
  await page.keyboard.press('Enter');
  // solved: |I(R1)| from the coupled-pair equations with the source across L1:
  // I2 = jωM·V / (jωL1·(R + jωL2) + ω²M²) (field notes, coupled windings), 10 mH each, k = 0.95, R = 100 Ω, 50 Hz
  const w = 2 * Math.PI * 50, L = 0.01, M = 0.95 * L, R = 100;
  const den = { re: -w * L * w * L + w * w * M * M, im: w * L * R };
  const expected = (w * M * 230) / Math.hypot(den.re, den.im);
  // the source's 230 V is solved once its entry is: wait for the sheet to hold it, then for the readings of that sheet
  await expect.poll(async () => (await state(page)).sheet.parts.find((p: any) => p.ref === 'V1').value).toBe(230);
  await expect.poll(async () => {
    const shown = Number(await page.locator('[data-testid="readings-parts"] tr[data-name="R1"] td[data-col="i"]').getAttribute('data-mag'));
    return Math.abs(shown / expected - 1);
  }).toBeLessThan(1e-9);
  await shot(page, info, 'keyboard-drawn');
  // export: the command list finds the SVG picture, Enter saves it
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('/');
  await expect(page.getByTestId('command-query')).toBeFocused();
  await page.keyboard.type('save picture');
  const [svg] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Enter')]);
  expect(svg.suggestedFilename()).toMatch(/\.svg$/);
});

for (const [width, height] of [[1440, 900], [1024, 768]] as const) {
  test(`at ${width}×${height} the drawing keeps its minimum size with every panel open, and no two tags overlap on the example sheets`, async ({ page }, info) => {
    await page.setViewportSize({ width, height });
    await page.goto('/');
    for (const key of ['isolation', 'wireless', 'current-transformer']) {
      await page.getByRole('button', { name: /Sheets/ }).click();
      await page.locator(`[data-example="${key}"]`).click();
      await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
      await page.getByRole('toolbar', { name: 'Edit and view' }).getByRole('button', { name: /^Show all/ }).click();
      // tags from the boxes the canvas laid out: no two overlap
      await expect.poll(async () => (await page.evaluate(() => (window as any).__coilwright.tags())).length).toBeGreaterThan(3);
      const boxes: Box[] = await page.evaluate(() => (window as any).__coilwright.tags());
      for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i], b = boxes[j];
        const overlap = Math.max(0, Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0)) * Math.max(0, Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0));
        expect(overlap, `${a.text} over ${b.text} on ${key}`).toBe(0);
      }
      await shot(page, info, `${width}-${key}`);
    }
    // every panel open: an analysis view, the notices expanded; the drawing keeps at least its minimum height
    // the isolation sheet: a hazard and a note, so the notices have something to expand
    await page.getByRole('button', { name: /Sheets/ }).click();
    await page.locator('[data-example="isolation"]').click();
    await expect(page.getByTestId('notices-toggle')).toBeVisible();
    const stage = (await page.locator('.stage').boundingBox())!;
    const minimum = Math.min(420, Math.max(240, 0.45 * stage.height)) - 1;
    for (const view of [/^Sweep/, /^Power balance/, /^Phasors/, /^T-equivalent/, /^Compare dots/]) {
      await page.getByRole('toolbar', { name: 'Analysis views' }).getByRole('button', { name: view }).click();
      await page.getByTestId('notices-toggle').click();
      const canvas = (await page.getByTestId('sheet-canvas').boundingBox())!;
      expect(canvas.height).toBeGreaterThanOrEqual(minimum);
      await page.getByTestId('notices-toggle').click();
    }
    // the dock's splitter cannot push the drawing below it either
    const splitter = page.getByTestId('dock-splitter');
    await splitter.focus();
    for (let i = 0; i < 30; i++) await page.keyboard.press('ArrowUp');
    expect((await page.getByTestId('sheet-canvas').boundingBox())!.height).toBeGreaterThanOrEqual(minimum);
    await shot(page, info, `${width}-every-panel`);
    // Escape closes the view
    await page.keyboard.press('Escape');
    await expect(page.getByTestId('analysis-dock')).toHaveCount(0);
  });
}

test('a 1:200 ratio is typed as the trade writes it and shown that way; a refusal is in our own words', async ({ page }) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Alt+n');
  await page.keyboard.press('6');
  await page.keyboard.press('Enter');
  await page.keyboard.press('v');
  await page.keyboard.type('1:200');
  await page.keyboard.press('Enter');
  expect((await state(page)).sheet.parts[0].value).toBeCloseTo(1 / 200, 15);
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Escape');
  await page.keyboard.press(']');
  await expect(page.getByTestId('field-value')).toHaveValue('1:200');
  // the drawing writes it the same way (the SVG sheet carries the drawing's own text)
  await page.getByTestId('sheet-canvas').focus();
  const [dl] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Control+Shift+S')]);
  const svg = readFileSync((await dl.path())!, 'utf8');
  expect(svg).toContain('1 : 200');
  expect(svg).not.toContain('0.005 : 1');
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Escape');
  await page.keyboard.press(']');
  await page.getByTestId('field-value').fill('x:1');
  await page.getByTestId('field-value').press('Enter');
  await expect(page.locator('.field-error')).toContainText('"x" is not a known name');
  await expect(page.locator('.field-error')).not.toContainText('is not a function');
});

test('values solve while typed, marked pending until they do', async ({ page }) => {
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  const rload = (await state(page)).sheet.parts.find((p: any) => p.ref === 'Rload');
  await page.getByTestId('sheet-canvas').focus();
  // step to Rload with ] and type its value without Enter
  for (let i = 0; i < 20 && (await state(page)).selection[0] !== rload.id; i++) await page.keyboard.press(']');
  await page.keyboard.press('v');
  await page.keyboard.type('50');
  await expect(page.getByTestId('field-value')).toHaveAttribute('data-state', 'pending');
  await expect.poll(async () => (await state(page)).sheet.parts.find((p: any) => p.ref === 'Rload').value).toBe(50);
  await expect(page.getByTestId('field-value')).toHaveAttribute('data-state', 'ok');
  await page.keyboard.type('x');
  await expect(page.getByTestId('field-value')).toHaveAttribute('data-state', 'invalid');
  expect((await state(page)).sheet.parts.find((p: any) => p.ref === 'Rload').value).toBe(50);
});
