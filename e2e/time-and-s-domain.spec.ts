import { expect, test, type Locator, type Page } from '@playwright/test';
import { abs, add, clickSheet, cx, div, mul, shot, type C } from './helpers';

// The wireless-charging example (src/model/examples/wireless.ts): Vinv 50 V RMS at 85 kHz, Cp – Rcp (0.05 Ω) – Lpad (60 µH),
// Lveh (60 µH) – Rcs (0.05 Ω) – Cs – Rbat (8 Ω); each C tunes its loop to 85 kHz; k = 0.2.
const f0 = 85e3, k = 0.2, L = 60e-6, R1 = 0.05, R2 = 0.05 + 8;
const Cap = 1 / ((2 * Math.PI * f0) ** 2 * L);
const M = k * L;

/** Type a bad entry and see it refused with the reason, then a good one and see it taken. */
async function refusedThenTaken(field: Locator, panel: Locator, bad: string, reason: RegExp, good: string) {
  await field.fill(bad);
  await field.press('Enter');
  await expect(panel.getByRole('alert')).toContainText(reason);
  await field.fill(good);
  await field.press('Enter');
  await expect(panel.getByRole('alert')).toHaveCount(0);
}

async function openWireless(page: Page) {
  await page.goto('/');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect(page.getByTestId('convention')).toContainText('85 kHz');
}

test('initial values and a waveform in the details panel, the pair in three domains, the s-plane view, a switch', async ({ page }, info) => {
  await openWireless(page);
  const details = page.getByTestId('part-details');

  // a winding's initial current: a bad entry is refused naming the field, a good one is kept with its unit read
  await clickSheet(page, 400, 200);
  await refusedThenTaken(details.getByTestId('field-initialAmps'), details, 'lots', /^Initial current i\(0\): "lots"/, '500 mA');

  // a source's waveform: a step, whose time may not be negative (contract: step atS >= 0)
  await clickSheet(page, 100, 200);
  await details.getByTestId('waveform-shape').selectOption('step');
  await refusedThenTaken(details.getByTestId('wave-atS'), details, '-1m', /^At /, '1 ms');
  // the sheet keeps it: selected again, the field shows the stored value
  await clickSheet(page, 400, 200);
  await expect(details.getByTestId('field-initialAmps')).toHaveValue('500m');
  await clickSheet(page, 100, 200);
  await expect(details.getByTestId('wave-atS')).toHaveValue('1m');
  // its drawing spans the step and as long again, from 0 V to the phasor's peak √2·50 V = 70.7 V to 3 figures (rms to peak, common practice)
  await expect(details.getByTestId('waveform-preview')).toContainText('0 V to 70.7 V, 0 s to 2 ms');

  // the pair's law in three domains with the present values: both dots first, so +M (contract: d1·d2 = +1)
  await clickSheet(page, 400, 200);
  await clickSheet(page, 540, 200, ['Shift']);
  const eq = page.getByTestId('inspector-equations');
  await expect(eq).toContainText('(dots give +M)');
  // M = k·√(L1·L2) = 12 µH; ωL = 2π·85 kHz·60 µH = 32.04 Ω (arithmetic)
  await expect(page.getByTestId('equations-time')).toContainText('v_Lpad = 60 µH·di_Lpad/dt + 12 µH·di_Lveh/dt');
  await expect(page.getByTestId('equations-phasor')).toContainText('j32.04 Ω·I_Lpad + j6.409 Ω·I_Lveh');
  // s-domain initial-condition term of Lpad: −L1·i1(0) − M·i2(0) = −60 µH·0.5 A = −30 µWb (contract, s-domain law)
  await expect(page.getByTestId('equations-s')).toContainText('60 µH·500 mA');
  await expect(page.getByTestId('equations-s')).toContainText(/initial-condition term [−-]30 µWb/);
  // and Lveh's: −M·i1(0) = −12 µH·0.5 A = −6 µWb
  await expect(page.getByTestId('equations-s')).toContainText(/initial-condition term [−-]6 µWb/);
  await shot(page, info, 'three-domains');

  // the s-plane view from its tab: H from Vinv to the load current
  await page.getByRole('button', { name: /^Poles and zeros/ }).click();
  const panel = page.getByTestId('sdomain-panel');
  await panel.getByTestId('tf-input').selectOption('Vinv');
  await panel.getByTestId('tf-output').selectOption('current:Rbat');
  const poles = panel.getByTestId('splane-pole');
  // two L and two C: four natural frequencies, all reached from the source and seen in the load current
  await expect(poles).toHaveCount(4);
  await expect(panel.locator('[data-testid="tf-natural"] tbody tr')).toHaveCount(4);
  await expect(panel.locator('[data-testid="tf-natural"] tbody tr[data-seen="false"]')).toHaveCount(0);
  // each pole is a root of the mesh determinant Z11(s)·Z22(s) − (sM)², Zii = Ri + sL + 1/(sC) (mesh analysis, common practice)
  const ps: C[] = await poles.evaluateAll((els) => els.map((e) => ({ re: Number(e.getAttribute('data-re')), im: Number(e.getAttribute('data-im')) })));
  for (const p of ps) {
    const zl = (r: number) => add(add(cx(r), mul(p, cx(L))), div(cx(1), mul(p, cx(Cap))));
    const z11z22 = mul(zl(R1), zl(R2));
    const sm2 = mul(mul(p, p), cx(M * M));
    const residual = abs(add(z11z22, mul(cx(-1), sm2))) / abs(sm2);
    expect(residual).toBeLessThan(1e-6);
  }
  // two identical tuned resonators coupled by k split to ω0/√(1 ± k) when lossless (coupled-resonator theory, from memory);
  // the 8 Ω load damps them and moves |p| by a few per cent
  const w0 = 2 * Math.PI * f0;
  const mags = ps.map((p) => Math.hypot(p.re, p.im)).sort((a, b) => a - b);
  const expected = [w0 / Math.sqrt(1 + k), w0 / Math.sqrt(1 + k), w0 / Math.sqrt(1 - k), w0 / Math.sqrt(1 - k)];
  mags.forEach((m, i) => expect(Math.abs(m - expected[i]) / expected[i]).toBeLessThan(0.05));
  await expect(panel.getByTestId('tf-factored')).toContainText('H(s) =');
  await expect(panel.getByTestId('tf-polynomials')).toContainText('denominator');
  // hover a pole: its frequency, damping ratio and Q
  await poles.first().hover();
  await expect(panel.getByTestId('splane-hover')).toContainText(/pole s = .*ω0 = .*f = .*ζ = .*Q = /);
  await expect(panel).not.toContainText(/NaN|Infinity|null/);
  await shot(page, info, 's-plane');

  // a switch from the shelf: open or closed, and toggle times that must increase
  await page.getByRole('button', { name: /^Switch/ }).click();
  await clickSheet(page, 500, 420);
  await expect(details.getByTestId('switch-editor')).toBeVisible();
  await details.getByTestId('switch-open').check();
  await expect(details.getByTestId('switch-open')).toBeChecked();
  const toggles = details.getByTestId('field-togglesS');
  await refusedThenTaken(toggles, details, '2m, 1m', /Toggles at \(entry 2\) must be later than the time before it/, '1m, 2m');
  await expect(toggles).toHaveValue('1m, 2m');
});
