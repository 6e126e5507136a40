import type { Page, TestInfo } from '@playwright/test';

/** Screen position of a sheet point, read from the page's view (the drawing itself is driven with the mouse). */
export async function screenOf(page: Page, x: number, y: number): Promise<{ x: number; y: number }> {
  const box = (await page.getByTestId('sheet-canvas').boundingBox())!;
  const p = await page.evaluate(([a, b]) => (window as any).__coilwright.toScreen(a, b), [x, y]);
  return { x: box.x + p.x, y: box.y + p.y };
}

export async function clickSheet(page: Page, x: number, y: number, modifiers: ('Shift')[] = []): Promise<void> {
  const p = await screenOf(page, x, y);
  await page.mouse.move(p.x, p.y);
  for (const m of modifiers) await page.keyboard.down(m);
  await page.mouse.down();
  await page.mouse.up();
  for (const m of modifiers) await page.keyboard.up(m);
}

/** A screenshot kept in the test's output folder under test-results/ and attached to the report. */
export async function shot(page: Page, info: TestInfo, name: string): Promise<void> {
  const path = info.outputPath(`${name}.png`);
  await page.screenshot({ path });
  await info.attach(name, { path, contentType: 'image/png' });
}

/** The load current as shown in the readings table: magnitude (A) and angle (degrees). */
export async function readCurrent(page: Page, name: string): Promise<{ mag: number; deg: number }> {
  const cell = page.locator(`[data-testid="readings-parts"] tr[data-name="${name}"] td[data-col="i"]`);
  const mag = Number(await cell.getAttribute('data-mag'));
  const deg = Number(await cell.getAttribute('data-deg'));
  return { mag, deg };
}

/** Complex arithmetic for closed forms. */
export type C = { re: number; im: number };
export const cx = (re: number, im = 0): C => ({ re, im });
export const add = (a: C, b: C): C => ({ re: a.re + b.re, im: a.im + b.im });
export const mul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
export const abs = (a: C) => Math.hypot(a.re, a.im);
export const argDeg = (a: C) => (Math.atan2(a.im, a.re) * 180) / Math.PI;
export const angleGap = (a: number, b: number) => Math.abs((((a - b) % 360) + 540) % 360 - 180);
