import { expect, test, type Page } from '@playwright/test';
import { clickSheet, shot } from './helpers';

// The wireless-charging example (src/model/examples/wireless.ts): Vinv = 50 V∠0° RMS, Cp – Rcp (0.05 Ω) – Lpad (60 µH),
// Lveh (60 µH) – Rcs (0.05 Ω) – Cs – Rbat (8 Ω load); C tunes each loop to 85 kHz; k = 0.2.
const f = 85e3, L = 60e-6, R1 = 0.05, R2 = 0.05, R3 = 8, k = 0.2;

async function openWireless(page: Page) {
  await page.goto('/');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect(page.getByTestId('convention')).toContainText('85 kHz');
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Rbat"]')).toBeVisible();
}

/** The first number (with an SI prefix) in a text, in base units. */
function firstValue(text: string): number {
  const m = /(-?[\d.]+)\s*([pnµumkMG]?)/.exec(text)!;
  const pre: Record<string, number> = { p: 1e-12, n: 1e-9, µ: 1e-6, u: 1e-6, m: 1e-3, '': 1, k: 1e3, M: 1e6, G: 1e9 };
  return Number(m[1]) * pre[m[2]];
}

test('coupling inspector: k and M either way, refusal explained, impedance the source sees', async ({ page }, info) => {
  await openWireless(page);
  await clickSheet(page, 400, 200);
  await clickSheet(page, 540, 200, ['Shift']);
  const insp = page.getByTestId('coupling-inspector');
  await expect(insp).toBeVisible();
  // M = k·√(L1·L2) = 0.2 · 60 µH = 12 µH (field notes, coupling coefficient)
  await expect(page.getByTestId('inspector-m')).toHaveValue('12µ');
  // at resonance both loops are resistive: Z_in = R1 + (ωM)²/(R2 + R3) (field notes, reflected impedance)
  const w = 2 * Math.PI * f;
  const zin = R1 + (w * k * L) ** 2 / (R2 + R3);
  const shown = firstValue((await page.getByTestId('inspector-zin-Vinv').textContent())!);
  expect(Math.abs(shown - zin) / zin).toBeLessThan(1e-3); // closed form above, 4 figures shown
  await expect(page.getByTestId('inspector-zin-Vinv')).toContainText('∠0.0°');
  // at resonance the secondary current is −jωM·I1/(R2 + R3), 90° from I1, so the mutual energy averages to zero
  // (field notes, coupled windings; closed form)
  await expect(page.getByTestId('inspector-interaction')).toContainText('90° apart');
  await shot(page, info, 'inspector');

  // M beyond √(L1·L2) = 60 µH is refused with the reason
  await page.getByTestId('inspector-m').fill('70u');
  await page.getByTestId('inspector-m').press('Enter');
  await expect(insp.getByRole('alert')).toContainText('√(L1·L2)');
  // k = 0.5 gives M = 30 µH (M = k·√(L1·L2), field notes)
  await page.getByTestId('inspector-k').fill('0.5');
  await page.getByTestId('inspector-k').press('Enter');
  await expect(page.getByTestId('inspector-m')).toHaveValue('30µ');
  // and M = 6 µH gives k = 0.1
  await page.getByTestId('inspector-m').fill('6u');
  await page.getByTestId('inspector-m').press('Enter');
  await expect(page.getByTestId('inspector-k')).toHaveValue('0.1');
});

test('dot comparison: flipping L2 reverses the secondary current, the source sees the same impedance; accept moves the dot', async ({ page }, info) => {
  await openWireless(page);
  await clickSheet(page, 540, 200);
  await page.getByRole('button', { name: /^Compare dots/ }).click();
  const panel = page.getByTestId('compare-panel');
  await expect(panel).toBeVisible();
  await expect(page.getByTestId('compare-winding')).toHaveValue(/.+/);
  await page.getByTestId('compare-winding').selectOption({ label: 'Lveh' });
  const row = page.locator('[data-testid="compare-changes"] tr[data-label="Rbat current"]');
  await expect(row).toBeVisible();
  const before = Number(await row.getAttribute('data-before'));
  const after = Number(await row.getAttribute('data-after'));
  // M → −M reverses the induced EMF, so the load current changes sign, keeping its size (field notes: sign of M from the dots)
  expect(Math.abs(after - before) / before).toBeLessThan(1e-9);
  const delta = firstValue((await row.locator('td').nth(2).textContent())!);
  expect(Math.abs(delta - 2 * before) / (2 * before)).toBeLessThan(2e-3); // |ΔI| = |−I − I| = 2|I|, shown to 3 figures
  // reflected impedance does not depend on the dots (field notes), so V1 sees the same both ways
  const zRow = page.locator('[data-testid="compare-zin"] tbody tr').first();
  const zBefore = await zRow.locator('td').nth(0).textContent();
  const zAfter = await zRow.locator('td').nth(1).textContent();
  expect(zAfter).toBe(zBefore);
  await shot(page, info, 'compare');
  const dotBefore = await page.evaluate(() => (window as any).__coilwright.state().sheet.parts.find((p: any) => p.ref === 'Lveh').dot);
  await page.getByTestId('compare-accept').click();
  await expect.poll(() => page.evaluate(() => (window as any).__coilwright.state().sheet.parts.find((p: any) => p.ref === 'Lveh').dot)).not.toBe(dotBefore);
});

test('T-equivalent: arms and isolation note, drawn in place with agreeing ports, then the pair put back exactly', async ({ page }, info) => {
  await openWireless(page);
  const original = await page.evaluate(() => JSON.stringify((window as any).__coilwright.state().sheet));
  await page.getByRole('button', { name: /^T-equivalent/ }).click();
  const arms = page.getByTestId('t-arms');
  await expect(arms).toBeVisible();
  // L1 − M = 60 µH − 12 µH = 48 µH; shunt M = 12 µH (field notes, T-equivalent)
  await expect(arms.locator('tr[data-arm="arm1"] td')).toHaveText('48 µH');
  await expect(arms.locator('tr[data-arm="arm2"] td')).toHaveText('48 µH');
  await expect(arms.locator('tr[data-arm="shunt"] td')).toHaveText('12 µH');
  await expect(page.getByTestId('t-notes')).toContainText('removes the isolation');
  const graphCheck = Number(await page.getByTestId('t-check').getAttribute('data-maxrel'));
  expect(graphCheck).toBeLessThan(1e-9); // the T is exact for the port quantities (field notes)

  await page.getByTestId('t-draw').click();
  const check = page.getByTestId('t-sheet-check');
  await expect(check).toBeVisible();
  expect(Number(await check.getAttribute('data-maxrel'))).toBeLessThan(1e-9); // same closed-form equivalence, solved from the sheet
  // the arms: names of their own, equivalent arms with no polarity dots, joined by wires rather than node labels
  const kinds = await page.evaluate(() => (window as any).__coilwright.state().sheet.parts.map((p: any) => p.kind).join(','));
  expect(kinds).not.toContain('label');
  expect(kinds).not.toContain('winding');
  for (const arm of ['Lt1', 'Lt2', 'Lt3']) await expect(page.locator(`[data-testid="readings-parts"] tr[data-name="${arm}"]`)).toBeVisible();
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Lpad"]')).toHaveCount(0);
  await shot(page, info, 't-drawn');
  // the sheet with the T drawn in place, the dock closed; then the pair comes back from the keyboard (B)
  await page.getByRole('button', { name: /^Close the analysis view/ }).click();
  await page.getByRole('toolbar', { name: 'Edit and view' }).getByRole('button', { name: /^Show all/ }).click();
  await shot(page, info, 't-on-sheet');
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('b');
  await expect.poll(() => page.evaluate(() => JSON.stringify((window as any).__coilwright.state().sheet))).toBe(original);
  await shot(page, info, 't-restored');
});

test('series pair: aiding and opposing inductances with the inductance measured both ways', async ({ page }, info) => {
  // L1 (3 mH, dot at b) and L2 (12 mH, dot at the middle node m) in series, k = 0.8, 2 kHz
  const L1 = 3e-3, L2 = 12e-3, k = 0.8;
  const M = k * Math.sqrt(L1 * L2);
  const file = info.outputPath('series-pair.json');
  (await import('node:fs')).writeFileSync(file, JSON.stringify({
    schema: 'coilwright.graph/1', frequencyHz: 2000, amplitudes: 'rms', ground: 'gnd',
    elements: [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 5 },
      { id: 'L1', kind: 'inductor', nodes: ['b', 'm'], henries: L1, dot: 'first' },
      { id: 'L2', kind: 'inductor', nodes: ['m', 'gnd'], henries: L2, dot: 'first' },
    ],
    couplings: [{ id: 'K1', windings: ['L1', 'L2'], k }],
  }));
  await page.goto('/');
  await page.getByTestId('file-input').setInputFiles(file);
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="L2"]')).toBeVisible();
  await page.getByRole('button', { name: /^Compare dots/ }).click();
  await page.getByTestId('compare-winding').selectOption({ label: 'L2' });
  const conn = page.getByTestId('compare-connection');
  await expect(conn).toContainText('series');
  const read = async (id: string) => {
    const t = (await page.getByTestId(id).textContent())!;
    const m = /(-?[\d.]+)\s*([µum]?)H/.exec(t)!;
    return Number(m[1]) * ({ µ: 1e-6, u: 1e-6, m: 1e-3, '': 1 } as Record<string, number>)[m[2]];
  };
  // series aiding L1 + L2 + 2M and opposing L1 + L2 − 2M (field notes, series connection), measured from the solves
  await expect(page.getByTestId('measured-before')).not.toHaveText('—');
  const before = await read('measured-before');
  const after = await read('measured-after');
  const aid = L1 + L2 + 2 * M, opp = L1 + L2 - 2 * M;
  const [expBefore, expAfter] = (await conn.textContent())!.includes('aiding as drawn') ? [aid, opp] : [opp, aid];
  expect(Math.abs(before - expBefore) / expBefore).toBeLessThan(1e-3); // 4 figures shown
  expect(Math.abs(after - expAfter) / expAfter).toBeLessThan(1e-3);
  await shot(page, info, 'series-pair');
});
