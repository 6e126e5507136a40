import { expect, test } from '@playwright/test';
import { clickSheet, shot } from './helpers';

// The wireless-charging example (src/model/examples/wireless.ts): Vinv at 85 kHz feeding the tuned pair; Vinv sits at (100, 200).

/** √(Σ_{odd n = 3..N} 1/n²): the THD of a square wave rebuilt from its harmonics up to N; it tends to √(π²/8 − 1) ≈ 48.34 % (standard). */
function squareThd(N: number): number {
  let s = 0;
  for (let n = 3; n <= N; n += 2) s += 1 / (n * n);
  return Math.sqrt(s);
}

test('a source switched to a square wave shows its harmonics: THD, true RMS, one period rebuilt, power per harmonic', async ({ page }, info) => {
  await page.goto('/');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect(page.getByTestId('convention')).toContainText('85 kHz');

  // the source as a ±50 V square wave at 85 kHz, typed in the details panel
  await clickSheet(page, 100, 200);
  const details = page.getByTestId('part-details');
  await details.getByTestId('waveform-shape').selectOption('square');
  const low = details.getByTestId('wave-low');
  await low.fill('-50');
  await low.press('Enter');
  const high = details.getByTestId('wave-high');
  await high.fill('50');
  await high.press('Enter');
  await expect(details.getByTestId('wave-low')).toHaveValue('-50');

  await page.getByRole('button', { name: /^Harmonics/ }).click();
  const panel = page.getByTestId('harmonic-panel');
  await expect(panel.getByTestId('harmonic-summary')).toContainText('fundamental 85 kHz; 102 harmonics solved up to order 203');
  const voltage = panel.locator('[data-testid="harmonic-card"][data-key="v:Vinv"]');
  const current = panel.locator('[data-testid="harmonic-card"][data-key="i:Vinv"]');
  // the drive's THD: 48.09 % with 203 harmonics, the truncated series of √(π²/8 − 1) = 48.34 % (standard)
  await expect(voltage.getByTestId('harmonic-thd')).toHaveText(`${(squareThd(203) * 100).toFixed(1)} %`);
  expect(Number(await voltage.getByTestId('harmonic-thd').getAttribute('data-thd'))).toBeCloseTo(squareThd(203), 10);
  // the true RMS of a ±50 V square wave is 50 V; 203 harmonics keep 99.9 % of it (Parseval): 49.95 V
  await expect(voltage.getByTestId('harmonic-rms')).toHaveText('49.95 V');
  // the tuned pair passes little but the fundamental: the primary current's THD is 2.28 % (test/solver/harmonics.test.ts, closed form per harmonic)
  await expect(current.getByTestId('harmonic-thd')).toHaveText('2.28 %');
  // the first row is the fundamental, (4/π)·50 V peak = 45.02 V RMS (standard), lagging the cosine by 90°
  const first = voltage.locator('[data-testid="harmonic-table"] tbody tr').first();
  await expect(first).toHaveAttribute('data-order', '1');
  await expect(first).toContainText('45.02 V');
  await expect(first).toContainText('-90.0°');
  // power per harmonic: nearly all of the 393.3 W rides on the fundamental
  await expect(panel.getByTestId('harmonic-delivered')).toHaveText('393.3 W');
  await expect(panel.locator('[data-testid="harmonic-power"] tbody tr').first()).toContainText('100.0 %');
  await expect(panel.getByTestId('harmonic-period').locator('path[data-label="V(Vinv)"]')).toHaveCount(1);
  await shot(page, info, 'harmonics-square');

  // more harmonics, the user's choice: THD closer to the limit
  const count = panel.getByTestId('harmonic-count');
  await count.fill('2001');
  await count.press('Enter');
  await expect(panel.getByTestId('harmonic-summary')).toContainText('1001 harmonics solved up to order 2001');
  await expect(voltage.getByTestId('harmonic-thd')).toHaveText(`${(squareThd(2001) * 100).toFixed(1)} %`);
  // a count out of range is refused naming the field, and the last good answer stays
  await count.fill('0');
  await count.press('Enter');
  await expect(panel.getByRole('alert')).toContainText('Harmonics: "0" is not a whole number from 1 to 5000');
  await expect(voltage.getByTestId('harmonic-thd')).toHaveText(`${(squareThd(2001) * 100).toFixed(1)} %`);

  // a step is not periodic: refused naming the source
  await details.getByTestId('waveform-shape').selectOption('step');
  await expect(panel.getByTestId('harmonic-refused')).toContainText('element "Vinv"');
  await expect(panel.getByTestId('harmonic-refused')).toContainText('a step is not periodic');
});
