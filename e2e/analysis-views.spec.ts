import { expect, test } from '@playwright/test';
import { shot } from './helpers';

test('power balance and phasor views of the wireless pair', async ({ page }, info) => {
  await page.goto('/');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Rbat"]')).toBeVisible();

  await page.getByRole('button', { name: /^Power balance/ }).click();
  await expect(page.getByTestId('power-panel')).toBeVisible();
  // Tellegen: the complex powers of all parts sum to zero (Tellegen, 1952)
  expect(Number(await page.getByTestId('power-tellegen').getAttribute('data-relative'))).toBeLessThan(1e-9);
  // at resonance both loops are resistive; efficiency = Rrefl/(R1 + Rrefl) · R3/(R2 + R3),
  // Rrefl = (ωM)²/(R2 + R3) (field notes, reflected impedance), ω = 2π·85 kHz, M = 0.2·60 µH, R1 = R2 = 0.05 Ω, R3 = 8 Ω
  const w = 2 * Math.PI * 85e3, M = 0.2 * 60e-6;
  const rr = (w * M) ** 2 / 8.05;
  const eta = (rr / (0.05 + rr)) * (8 / 8.05);
  const shown = Number((await page.getByTestId('power-efficiency').textContent())!.replace('%', '')) / 100;
  expect(Math.abs(shown - eta)).toBeLessThan(1e-4); // shown to 0.01 %
  await shot(page, info, 'power');

  await page.getByRole('button', { name: /^Phasors/ }).click();
  const diagram = page.getByTestId('phasor-diagram');
  await expect(diagram).toBeVisible();
  await expect(diagram.locator('g[data-label]')).toHaveCount(4); // V and I of Lpad and Lveh
  await expect(page.getByTestId('phasor-legend')).toContainText('V(Lpad)');
  await expect(page.getByTestId('waveforms').locator('path')).toHaveCount(4);
  await shot(page, info, 'phasors');
});
