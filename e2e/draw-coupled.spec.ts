import { expect, test } from '@playwright/test';
import { writeFileSync } from 'node:fs';
import { abs, add, angleGap, argDeg, clickSheet, cx, div, mul, readCurrent, shot } from './helpers';

// The circuit drawn: V1 (10 V∠0°, + on top) → R1 (50 Ω) → L1 (10 mH, dot on top) to ground;
// L2 (20 mH, dot on top) loaded by R2 (100 Ω); k = 0.8; 1 kHz, RMS.
const f = 1000, V = 10, R1 = 50, L1 = 10e-3, L2 = 20e-3, R2 = 100, k = 0.8;

/**
 * Reflected impedance (field notes, "Coupled windings", from memory):
 * Z_in = Z1 + (ωM)² / (jωL2 + R2 + Z_L); here R2 is the load and the secondary has no own resistance.
 * The load current along R2's reference (top → bottom) is I_load = ±jωM·I1 / (jωL2 + R2),
 * + with both dots on top, − with one dot moved (M → −M).
 */
function primaryCurrent() {
  const w = 2 * Math.PI * f;
  const M = k * Math.sqrt(L1 * L2);
  const Zin = add(cx(R1, w * L1), div(cx((w * M) ** 2), cx(R2, w * L2)));
  return div(cx(V), Zin); // the same for either dot position: (ωM)² does not see the sign of M
}

function loadCurrent(sign: 1 | -1) {
  const w = 2 * Math.PI * f;
  const M = k * Math.sqrt(L1 * L2);
  return div(mul(cx(0, sign * w * M), primaryCurrent()), cx(R2, w * L2));
}

test('draw a coupled circuit from nothing and read the load current', async ({ page }, info) => {
  await page.goto('/');
  await expect(page.getByTestId('convention')).toContainText('50 Hz');
  await shot(page, info, '01-demo-on-first-load');
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Vmains"]')).toBeVisible();

  // a new empty sheet
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Alt+n');
  await expect(page.locator('[data-testid="readings-parts"]')).toHaveCount(0);

  // parts, placed from the keyboard shelf keys and the mouse
  await page.keyboard.press('4'); await clickSheet(page, 100, 200); // V1: pins (100,170) + and (100,230)
  await page.keyboard.press('1'); await clickSheet(page, 200, 170); // R1: pins (170,170), (230,170)
  await page.keyboard.press('2'); await clickSheet(page, 300, 200); // L1: pins (300,170), (300,230)
  await page.keyboard.press('2'); await clickSheet(page, 450, 200); // L2: pins (450,170), (450,230)
  await page.keyboard.press('1'); await page.keyboard.press('.'); await clickSheet(page, 550, 200); // R2 standing
  await page.keyboard.press('7'); await clickSheet(page, 100, 300); // ground

  // wires
  await page.keyboard.press('j');
  await clickSheet(page, 100, 170); await clickSheet(page, 170, 170);
  await clickSheet(page, 230, 170); await clickSheet(page, 300, 170);
  await clickSheet(page, 100, 230); await clickSheet(page, 100, 300);
  await clickSheet(page, 300, 230); await clickSheet(page, 300, 300); await clickSheet(page, 100, 300);
  await clickSheet(page, 450, 170); await clickSheet(page, 550, 170);
  await clickSheet(page, 450, 230); await clickSheet(page, 450, 300); await clickSheet(page, 550, 300); await clickSheet(page, 550, 230);
  await page.keyboard.press('p');
  await shot(page, info, '02-drawn');

  // values
  await clickSheet(page, 200, 170);
  await page.getByTestId('field-value').fill('50');
  await page.getByTestId('field-value').press('Enter');
  await clickSheet(page, 300, 200);
  await page.getByTestId('field-value').fill('10 mH');
  await page.getByTestId('field-value').press('Enter');
  await clickSheet(page, 450, 200);
  await page.getByTestId('field-value').fill('20m');
  await page.getByTestId('field-value').press('Enter');
  await clickSheet(page, 550, 200);
  await page.getByTestId('field-value').fill('100');
  await page.getByTestId('field-value').press('Enter');
  await clickSheet(page, 100, 200);
  await page.getByTestId('field-value').fill('10');
  await page.getByTestId('field-value').press('Enter');

  // couple the windings: pick L1, shift-pick L2, link
  await clickSheet(page, 300, 200);
  await clickSheet(page, 450, 200, ['Shift']);
  await page.keyboard.press('c');
  await page.getByTestId('field-coupling').fill('0.8');
  await page.getByTestId('field-coupling').press('Enter');

  // the sheet's frequency
  await clickSheet(page, 700, 400);
  await page.getByTestId('sheet-frequency').fill('1k');
  await page.getByTestId('sheet-frequency').press('Enter');
  await expect(page.getByTestId('convention')).toContainText('1 kHz');

  const aiding = loadCurrent(1);
  await expect.poll(async () => (await readCurrent(page, 'R2')).mag).toBeCloseTo(abs(aiding), 6);
  const r = await readCurrent(page, 'R2');
  expect(angleGap(r.deg, argDeg(aiding))).toBeLessThan(1e-6); // angle from the reflected-impedance closed form
  const i1 = await readCurrent(page, 'R1');
  expect(i1.mag).toBeCloseTo(abs(primaryCurrent()), 9); // I1 = V / Z_in (closed form)
  expect(angleGap(i1.deg, argDeg(primaryCurrent()))).toBeLessThan(1e-6);
  await shot(page, info, '03-solved-aiding');

  // move L2's dot to its other end with one click on it: (459,176) for a standing winding at (450,200)
  await clickSheet(page, 459, 176);
  const opposing = loadCurrent(-1);
  await expect.poll(async () => (await readCurrent(page, 'R2')).deg).toBeCloseTo(argDeg(opposing), 4);
  expect((await readCurrent(page, 'R2')).mag).toBeCloseTo(abs(opposing), 6); // same magnitude, −M (closed form)
  expect(angleGap((await readCurrent(page, 'R2')).deg, argDeg(aiding) + 180)).toBeLessThan(1e-6); // −M turns the load current round
  expect((await readCurrent(page, 'R1')).mag).toBeCloseTo(abs(primaryCurrent()), 9); // Z_in does not depend on the dots
  await shot(page, info, '04-dot-moved');

  // undo and redo
  await page.keyboard.press('Control+z');
  await expect.poll(async () => (await readCurrent(page, 'R2')).deg).toBeCloseTo(argDeg(aiding), 4);
  await page.keyboard.press('Control+y');
  await expect.poll(async () => (await readCurrent(page, 'R2')).deg).toBeCloseTo(argDeg(opposing), 4);

  // reload: the sheet is back exactly
  await page.reload();
  await expect.poll(async () => (await readCurrent(page, 'R2')).deg).toBeCloseTo(argDeg(opposing), 4);
  await expect(page.getByTestId('convention')).toContainText('1 kHz');
  await shot(page, info, '05-after-reload');

  // a bad value is refused inline and the last good value stays
  await clickSheet(page, 200, 170);
  await page.getByTestId('field-value').fill('fifty ohms');
  await page.getByTestId('field-value').press('Enter');
  await expect(page.locator('.field-error')).toContainText('"fifty" is not a known name');
  await expect(page.locator('.field-error')).toContainText('still 50');
  await page.getByTestId('field-value').fill('-5');
  await page.getByTestId('field-value').press('Enter');
  await expect(page.locator('.field-error')).toContainText('Resistance must be more than zero');
  expect((await readCurrent(page, 'R2')).mag).toBeCloseTo(abs(opposing), 6);
  await shot(page, info, '06-bad-value');
  await page.getByTestId('field-value').press('Escape');

  // save a file, then open it again
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /^Save file/ }).click()]);
  const saved = info.outputPath('saved.coilwright.json');
  await download.saveAs(saved);
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: /^Open file/ }).click()]);
  await chooser.setFiles(saved);
  await expect(page.locator('.notice-info, .notice')).toContainText(['Opened']);
  await expect.poll(async () => (await readCurrent(page, 'R2')).mag).toBeCloseTo(abs(opposing), 6);

  // a broken file is refused and the sheet stays
  const broken = info.outputPath('broken.json');
  writeFileSync(broken, '{ "schema": "coilwright.sheet/3", "parts": [ {');
  const [chooser2] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: /^Open file/ }).click()]);
  await chooser2.setFiles(broken);
  await expect(page.locator('.notice-error')).toContainText('not valid JSON');
  await expect(page.locator('.notice-error')).toContainText('current sheet is unchanged');
  expect((await readCurrent(page, 'R2')).mag).toBeCloseTo(abs(opposing), 6);
  await shot(page, info, '07-broken-file-refused');
});
