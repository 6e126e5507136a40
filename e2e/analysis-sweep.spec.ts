import { expect, test, type Page } from '@playwright/test';
import { shot } from './helpers';

async function openWireless(page: Page) {
  await page.goto('/');
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator('[data-example="wireless"]').click();
  await expect(page.getByTestId('convention')).toContainText('85 kHz');
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Rbat"]')).toBeVisible();
}

test('sweep finds the resonance of the 85 kHz pair within 1 % of 1/(2π√(LC))', async ({ page }, info) => {
  await openWireless(page);
  const { L, C } = await page.evaluate(() => {
    const parts = (window as any).__coilwright.state().sheet.parts;
    return { L: parts.find((p: any) => p.ref === 'Lpad').value, C: parts.find((p: any) => p.ref === 'Cp').value };
  });
  const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C)); // series resonance (field notes)
  await page.getByRole('button', { name: /^Sweep/ }).click();
  await expect(page.getByTestId('sweep-trace')).toHaveCount(1); // Z seen by Vinv, offered first
  await page.getByTestId('sweep-quantity').selectOption({ label: 'I(Rbat) current' });
  await page.getByTestId('sweep-add').click();
  await expect(page.getByTestId('sweep-trace')).toHaveCount(2);
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  const zeros = await page.locator('[data-testid="sweep-markers"] li[data-kind="phase-zero"]').evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-frequency'))));
  const nearest = zeros.reduce((b, f) => (Math.abs(f - f0) < Math.abs(b - f0) ? f : b), Infinity);
  expect(Math.abs(nearest - f0) / f0).toBeLessThan(0.01); // within 1 % of the closed form
  console.log(`resonance marker ${nearest.toFixed(1)} Hz, closed form ${f0.toFixed(1)} Hz; ${await page.getByTestId('sweep-status').textContent()}`);
  // cursor readout
  const plot = page.getByTestId('plot-magnitude').locator('svg');
  await plot.scrollIntoViewIfNeeded();
  const box = (await plot.boundingBox())!;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await expect(page.getByTestId('sweep-readout')).toContainText('Hz');
  await expect(page.getByTestId('sweep-readout')).toContainText('Z seen by Vinv');
  await shot(page, info, 'sweep');
  // CSV export
  const download = page.waitForEvent('download');
  await page.getByTestId('sweep-csv').click();
  const file = await (await download).path();
  const text = (await import('node:fs')).readFileSync(file!, 'utf8');
  expect(text.split('\n').filter((l) => /^\d/.test(l))).toHaveLength(400); // one row per point
});

test('a long sweep shows progress and can be cancelled', async ({ page }) => {
  await openWireless(page);
  // the sweep waits after its first chunk until it is cancelled: it cannot finish before the click, however fast the machine
  await page.evaluate(() => (window as any).__coilwright.test.holdSweeps(true));
  await page.getByRole('button', { name: /^Sweep/ }).click();
  await page.getByTestId('sweep-points').fill('100000');
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'running');
  await expect.poll(async () => Number(await page.getByTestId('sweep-progress').getAttribute('value'))).toBeGreaterThan(0);
  await page.getByTestId('sweep-cancel').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'cancelled');
  await expect(page.getByTestId('sweep-run')).toBeEnabled();
});

test('dragging the k slider moves the plot (frequency splitting)', async ({ page }, info) => {
  await openWireless(page);
  await page.getByRole('button', { name: /^Sweep/ }).click();
  await page.getByTestId('sweep-quantity').selectOption({ label: 'I(Rbat) current' });
  await page.getByTestId('sweep-add').click();
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  await page.getByTestId('slider-target').selectOption({ label: 'k of Lpad–Lveh' });
  const path = page.getByTestId('plot-magnitude').locator('path').first();
  const before = await path.getAttribute('d');
  const peaksBefore = await page.locator('[data-testid="sweep-markers"] li[data-kind="peak"]').count();
  const slider = page.getByTestId('slider');
  const b = (await slider.boundingBox())!;
  await page.mouse.move(b.x + b.width * 0.2, b.y + b.height / 2);
  await page.mouse.down();
  await page.mouse.move(b.x + b.width * 0.6, b.y + b.height / 2, { steps: 8 });
  await page.mouse.up();
  await expect(page.getByTestId('slider-value')).not.toContainText('0.200');
  await expect.poll(() => path.getAttribute('d')).not.toBe(before);
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  // above critical coupling the load current splits into two peaks (field notes, coupled resonators)
  await expect.poll(() => page.locator('[data-testid="sweep-markers"] li[data-kind="peak"]').count()).toBeGreaterThanOrEqual(Math.max(2, peaksBefore));
  await shot(page, info, 'sweep-slider');
});
