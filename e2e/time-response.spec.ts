import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { parseCsv } from '../src/export/csv';
import { abs, add, clickSheet, cx, div, mul, shot } from './helpers';

// The circuit drawn: V1 (10 V RMS ∠0°, 1 kHz, following its phasor: 10·√2·cos ωt) → S1 (open at t = 0, closes at 1 ms;
// 1 mΩ closed) → R1 (50 Ω) → L1 (10 mH, dot on top) to ground; L2 (20 mH, dot on top) loaded by R2 (100 Ω); k = 0.8.
const f = 1000, V = 10, R1 = 50 + 0.001, L1 = 10e-3, L2 = 20e-3, R2 = 100, k = 0.8;
const w = 2 * Math.PI * f;
const M = k * Math.sqrt(L1 * L2);

/**
 * The load current's steady state, from the reflected impedance (field notes, "Coupled windings", from memory):
 * I1 = V / (R1 + jωL1 + (ωM)²/(R2 + jωL2)), I2 = jωM·I1/(R2 + jωL2) (magnitude; its sign follows the dots).
 * Its peak is √2·|I2| (RMS phasor to peak, common practice).
 */
function loadPeak(): number {
  const zin = add(cx(R1, w * L1), div(cx((w * M) ** 2), cx(R2, w * L2)));
  const i1 = div(cx(V), zin);
  const i2 = div(mul(cx(0, w * M), i1), cx(R2, w * L2));
  return Math.SQRT2 * abs(i2);
}

type Arrow = { from: { x: number; y: number }; to: { x: number; y: number }; width: number; element?: string };
const arrowsOf = (page: Page) => page.evaluate(() => (window as any).__coilwright.arrows() as { instantS: number | null; arrows: Arrow[] });

async function field(page: Page, id: string, text: string) {
  const el = page.getByTestId(id);
  await el.fill(text);
  await el.press('Enter');
}

test('draw a source, a switch and a coupled pair; the time view reads the peak current and the sheet follows its cursor', async ({ page }, info) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Alt+n');

  // parts from the shelf keys and the mouse
  await page.keyboard.press('4'); await clickSheet(page, 100, 200); // V1: pins (100,170) + and (100,230)
  await page.keyboard.press('9'); await clickSheet(page, 200, 170); // S1: pins (170,170), (230,170)
  await page.keyboard.press('1'); await clickSheet(page, 300, 170); // R1: pins (270,170), (330,170)
  await page.keyboard.press('2'); await clickSheet(page, 400, 200); // L1: pins (400,170), (400,230)
  await page.keyboard.press('2'); await clickSheet(page, 550, 200); // L2: pins (550,170), (550,230)
  await page.keyboard.press('1'); await page.keyboard.press('.'); await clickSheet(page, 650, 200); // R2 standing
  await page.keyboard.press('7'); await clickSheet(page, 100, 300); // ground

  await page.keyboard.press('j');
  await clickSheet(page, 100, 170); await clickSheet(page, 170, 170);
  await clickSheet(page, 230, 170); await clickSheet(page, 270, 170);
  await clickSheet(page, 330, 170); await clickSheet(page, 400, 170);
  await clickSheet(page, 100, 230); await clickSheet(page, 100, 300);
  await clickSheet(page, 400, 230); await clickSheet(page, 400, 300); await clickSheet(page, 100, 300);
  await clickSheet(page, 550, 170); await clickSheet(page, 650, 170);
  await clickSheet(page, 550, 230); await clickSheet(page, 550, 300); await clickSheet(page, 650, 300); await clickSheet(page, 650, 230);
  await page.keyboard.press('p');

  // values
  await clickSheet(page, 300, 170); await field(page, 'field-value', '50');
  await clickSheet(page, 400, 200); await field(page, 'field-value', '10 mH');
  await clickSheet(page, 550, 200); await field(page, 'field-value', '20m');
  await clickSheet(page, 650, 200); await field(page, 'field-value', '100');
  await clickSheet(page, 100, 200); await field(page, 'field-value', '10');
  // the switch: open at t = 0, closing at 1 ms
  await clickSheet(page, 200, 165);
  await page.getByTestId('switch-open').check();
  await field(page, 'field-togglesS', '1m');
  // couple the windings
  await clickSheet(page, 400, 200);
  await clickSheet(page, 550, 200, ['Shift']);
  await page.keyboard.press('c');
  await field(page, 'field-coupling', '0.8');
  await clickSheet(page, 800, 450);
  await field(page, 'sheet-frequency', '1k');
  await expect(page.getByTestId('convention')).toContainText('1 kHz');
  // the phasors are on the sheet (the switch is open in the phasor solve, so only a trickle flows)
  await expect.poll(async () => (await arrowsOf(page)).arrows.length).toBeGreaterThan(0);
  expect((await arrowsOf(page)).instantS).toBeNull();

  // the time view from its key: 10 ms at 20 000 samples (0.5 µs apart)
  await clickSheet(page, 800, 450);
  await page.keyboard.press('r');
  const panel = page.getByTestId('time-panel');
  await field(page, 'time-stop', '10m');
  await page.getByTestId('time-samples').fill('20000');
  await panel.getByTestId('time-run').click();
  await expect(panel.getByTestId('time-status')).toHaveAttribute('data-status', 'done');
  await expect(panel.getByTestId('time-trace')).toHaveCount(3); // i(L1), i(L2) and v(V1), chosen first
  // the source follows its phasor: the steady state is drawn faintly beside each trace
  await expect(panel.getByTestId('time-steady')).toHaveCount(3);
  await shot(page, info, '01-time-view');

  // the measuring window dragged on the plot over its later part, where the closing transient has died away
  // (its slower time constant is about 0.36 ms: the roots of (R1 + sL1)(R2 + sL2) − s²M², by hand)
  const plot = panel.getByTestId('time-plot').locator('svg');
  await plot.scrollIntoViewIfNeeded();
  const box = (await plot.boundingBox())!;
  await page.mouse.move(box.x + box.width * 0.62, box.y + box.height / 2);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width * 0.8, box.y + box.height / 2, { steps: 5 });
  await page.mouse.move(box.x + box.width * 0.96, box.y + box.height / 2, { steps: 5 });
  await page.mouse.up();
  const from = Number(await panel.getByTestId('time-window-text').getAttribute('data-from'));
  expect(from).toBeGreaterThan(5e-3);
  const row = panel.locator('[data-testid="time-measures"] tr[data-name="i(L2)"]');
  // the load current's peak over whole steady periods: √2·|I2| from the reflected impedance (closed form above)
  const peak = Number(await row.getByTestId('measure-peak').getAttribute('data-value'));
  expect(Math.abs(Math.abs(peak) - loadPeak()) / loadPeak()).toBeLessThan(2e-3);
  // and its RMS is the phasor's magnitude, peak/√2 (sinusoid, standard result); mean about 0
  const rms = Number(await row.getByTestId('measure-rms').getAttribute('data-value'));
  expect(Math.abs(rms - loadPeak() / Math.SQRT2) / (loadPeak() / Math.SQRT2)).toBeLessThan(5e-3);
  // after it settles the run matches the phasor solve (an independent engine): its last period within 0.1 % of the steady state's peak
  const gap = Number(await row.getByTestId('measure-gap').getAttribute('data-value'));
  expect(gap).toBeLessThan(1e-3);
  await expect(panel).not.toContainText(/NaN|Infinity|null/);

  // scrub the cursor with the keyboard: from the end, back a fiftieth of the run (72° of the 1 kHz wave) at a time
  await plot.focus();
  await page.keyboard.press('End');
  const seen: { i: number; down: boolean; width: number }[] = [];
  for (let step = 0; step < 6; step++) {
    if (step > 0) await page.keyboard.press('Shift+ArrowLeft');
    const readings = panel.getByTestId('time-readings');
    await expect(readings).not.toHaveAttribute('data-cursor', '');
    const at = Number(await readings.getAttribute('data-cursor'));
    // the sheet shows that instant
    await expect.poll(async () => (await arrowsOf(page)).instantS).toBe(at);
    const i = Number(await readings.locator('tr[data-name="i(L2)"]').getByTestId('time-reading').getAttribute('data-value'));
    const a = (await arrowsOf(page)).arrows.find((x) => x.element === 'L2');
    if (Math.abs(i) < 1e-6) continue;
    expect(a, `an arrow beside L2 at t = ${at}`).toBeTruthy();
    seen.push({ i, down: a!.to.y > a!.from.y, width: a!.width });
  }
  // L2 stands with pin 0 on top: its reference runs downwards, so the arrow points down exactly when i(L2) > 0 (graph-model reference directions)
  for (const s of seen) expect(s.down).toBe(s.i > 0);
  // over a period the current flows both ways, so the arrow turns; and it is drawn heavier for the larger current
  expect(new Set(seen.map((s) => s.down)).size).toBe(2);
  const big = seen.reduce((a, b) => (Math.abs(b.i) > Math.abs(a.i) ? b : a));
  const small = seen.reduce((a, b) => (Math.abs(b.i) < Math.abs(a.i) ? b : a));
  expect(big.width).toBeGreaterThan(small.width);
  await shot(page, info, '02-sheet-follows-cursor');

  // leaving the time view brings the phasors back
  await page.getByRole('button', { name: /Close the analysis view/ }).click();
  await expect.poll(async () => (await arrowsOf(page)).instantS).toBeNull();
});

test('the wireless pair over time: a bad stop time refused, Cancel, the traces as CSV, the plot and its measurements on the SVG sheet', async ({ page, context }, info) => {
  await page.goto('/');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect(page.getByTestId('convention')).toContainText('85 kHz');
  await page.getByRole('button', { name: /^Time response/ }).click();
  const panel = page.getByTestId('time-panel');

  // a stop time that cannot be read is refused naming the field, and the last good one stays
  await field(page, 'time-stop', 'soon');
  await expect(panel.getByRole('alert')).toContainText(/^Stop time: write a time like/);
  await field(page, 'time-stop', '100u');
  await expect(panel.getByRole('alert')).toHaveCount(0);
  await page.getByTestId('time-samples').fill('1000');
  await panel.getByTestId('time-run').click();
  await expect(panel.getByTestId('time-status')).toHaveAttribute('data-status', 'done');
  const traces = await panel.getByTestId('time-trace').count();
  expect(traces).toBeGreaterThan(0);

  // zoom with the keyboard about the cursor, pan, and back to the whole run
  const svg = panel.getByTestId('time-plot').locator('svg');
  await svg.focus();
  await page.keyboard.press('Home');
  for (let k = 0; k < 10; k++) await page.keyboard.press('Shift+ArrowRight'); // 10 × 100 µs / 50 = 20 µs
  const spanOf = async () => (await svg.getAttribute('data-span'))!.split(' ').map(Number);
  await expect.poll(async () => Number(await panel.getByTestId('time-readings').getAttribute('data-cursor'))).toBeCloseTo(20e-6, 12);
  const cursor = Number(await panel.getByTestId('time-readings').getAttribute('data-cursor'));
  await page.keyboard.press('+');
  // half the span, the cursor staying where it is on the axis: from 20 µs − 20/2 µs to 20 µs + 80/2 µs
  await expect.poll(async () => (await spanOf())[0]).toBeCloseTo(cursor / 2, 12);
  expect((await spanOf())[1]).toBeCloseTo(cursor + (100e-6 - cursor) / 2, 12);
  await panel.getByRole('button', { name: 'Pan to later times' }).click();
  // a quarter of the 50 µs span later
  await expect.poll(async () => (await spanOf())[0]).toBeCloseTo(cursor / 2 + 12.5e-6, 12);
  // the window from the keyboard: [ at the cursor starts it, ] later ends it
  await svg.focus();
  await page.keyboard.press('[');
  for (let k = 0; k < 5; k++) await page.keyboard.press('Shift+ArrowRight');
  await page.keyboard.press(']');
  await expect.poll(async () => Number(await panel.getByTestId('time-window-text').getAttribute('data-from'))).toBe(cursor);
  const to = Number(await panel.getByTestId('time-window-text').getAttribute('data-to'));
  expect(to).toBeGreaterThan(20e-6);
  await panel.getByTestId('time-whole').click();
  await expect.poll(async () => (await spanOf())[1]).toBeCloseTo(100e-6, 12);
  // the wheel over the plot zooms in about the pointer (to 0.8 of the span) and leaves the page where it was
  await svg.scrollIntoViewIfNeeded();
  const pb = (await svg.boundingBox())!;
  const scrolled = await panel.evaluate((el) => el.closest('.dock-body')?.scrollTop ?? 0);
  await page.mouse.move(pb.x + pb.width / 2, pb.y + pb.height / 2);
  await page.mouse.wheel(0, -100);
  await expect.poll(async () => { const [a, b] = await spanOf(); return b - a; }).toBeCloseTo(80e-6, 12);
  expect(await panel.evaluate((el) => el.closest('.dock-body')?.scrollTop ?? 0)).toBe(scrolled);
  await panel.getByTestId('time-whole').click();
  await panel.getByTestId('time-window-all').click();

  // a run held before its first step can only end by Cancel; the last complete run stays
  await page.evaluate(() => (window as any).__coilwright.test.holdTimeRuns(true));
  await panel.getByTestId('time-run').click();
  await expect(panel.getByTestId('time-status')).toHaveAttribute('data-status', 'running');
  await panel.getByTestId('time-cancel').click();
  await expect(panel.getByTestId('time-status')).toHaveAttribute('data-status', 'cancelled');
  await expect(panel.getByTestId('time-status')).toContainText('Run cancelled; the last complete run stays');
  await expect(panel.getByTestId('time-trace')).toHaveCount(traces);
  await page.evaluate(() => (window as any).__coilwright.test.holdTimeRuns(false));

  // the traces as CSV: a row per sample, 0 to 100 µs in steps of 100 ns
  const [csvDl] = await Promise.all([page.waitForEvent('download'), panel.getByTestId('time-csv').click()]);
  const rows = parseCsv(readFileSync(await csvDl.path(), 'utf8'));
  expect(rows[0][0]).toBe('time_s');
  expect(rows).toHaveLength(1 + 1001);
  expect(Number(rows[1001][0])).toBeCloseTo(100e-6, 15);
  expect(rows[0]).toHaveLength(1 + traces);
  for (const r of rows.slice(1)) for (const v of r) expect(Number.isFinite(Number(v))).toBe(true);
  await panel.screenshot({ path: info.outputPath('time-panel.png') });

  // the SVG sheet carries the plot and the measurement table
  await page.getByTestId('share-open').click();
  await expect(page.getByTestId('share-plots')).toBeChecked();
  const [svgDl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('share-svg').click()]);
  const file = info.outputPath('with-time.svg');
  await svgDl.saveAs(file);
  const view = await context.newPage();
  await view.goto(pathToFileURL(file).href);
  const facts = await view.evaluate(() => ({
    parserError: !!document.querySelector('parsererror'),
    plots: document.querySelectorAll('g.plot').length,
    text: document.documentElement.textContent ?? '',
  }));
  expect(facts.parserError).toBe(false);
  expect(facts.plots).toBeGreaterThanOrEqual(2); // the time plot and the measurements
  expect(facts.text).toContain('Measurements over 0 s to 100 µs');
  expect(facts.text).toContain('settling (2 %)');
  expect(facts.text).not.toMatch(/NaN|Infinity/);
  await view.screenshot({ path: info.outputPath('with-time.png') });
});
