import { expect, test, type Page } from '@playwright/test';
import { clickSheet, screenOf, shot } from './helpers';

interface PartView { ref: string; kind: string; x: number; y: number; rot: number; mirror: boolean }
interface View { parts: PartView[]; wires: number; selection: number; zoom: number; viewX: number; junctions: number }

const state = (page: Page): Promise<View> => page.evaluate(() => {
  const s = (window as any).__coilwright.state();
  return {
    parts: s.sheet.parts.map((p: any) => ({ ref: p.ref, kind: p.kind, x: p.x, y: p.y, rot: p.rot, mirror: p.mirror })),
    wires: s.sheet.wires.length,
    selection: s.selection.length,
    zoom: s.view.zoom,
    viewX: s.view.x,
    junctions: s.derived?.topology.junctions.length ?? 0,
  };
});

test('place, select, turn, mirror, copy, paste, remove, wire onto a wire, pan and zoom', async ({ page }, info) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').waitFor();
  await page.getByTestId('sheet-canvas').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Alt+n');

  // three resistors from the shelf, with the mouse
  for (const x of [100, 200, 300]) {
    await page.getByRole('button', { name: /^Resistor/ }).click();
    await clickSheet(page, x, 100);
  }
  expect((await state(page)).parts.map((p) => p.ref)).toEqual(['R1', 'R2', 'R3']);

  // box selection around the first two, then shift-click the third
  const a = await screenOf(page, 50, 70);
  const b = await screenOf(page, 250, 130);
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  await page.mouse.move(b.x, b.y, { steps: 4 });
  await page.mouse.up();
  expect((await state(page)).selection).toBe(2);
  await clickSheet(page, 300, 100, ['Shift']);
  expect((await state(page)).selection).toBe(3);

  // turn and flip by key
  await page.keyboard.press('.');
  expect((await state(page)).parts.every((p) => p.rot === 1)).toBe(true);
  await page.keyboard.press('f');
  expect((await state(page)).parts.every((p) => p.mirror)).toBe(true);
  await page.keyboard.press('Control+z');
  await page.keyboard.press('Control+z');
  expect((await state(page)).parts.every((p) => p.rot === 0 && !p.mirror)).toBe(true);

  // copy and paste, then remove what was pasted
  await page.keyboard.press('Control+c');
  await page.keyboard.press('Control+v');
  expect((await state(page)).parts.map((p) => p.ref)).toEqual(['R1', 'R2', 'R3', 'R4', 'R5', 'R6']);
  await page.keyboard.press('Delete');
  expect((await state(page)).parts).toHaveLength(3);

  // a wire from R1's right pin to R2's left pin, and a second wire from R3's right pin onto the middle of the first: a junction mark
  await page.keyboard.press('j');
  await clickSheet(page, 130, 100);
  await clickSheet(page, 170, 100);
  await clickSheet(page, 330, 100);
  await clickSheet(page, 330, 160);
  await clickSheet(page, 150, 160);
  await clickSheet(page, 150, 100);
  await page.keyboard.press('p');
  const s = await state(page);
  expect(s.wires).toBe(2);
  expect(s.junctions).toBe(1);
  await shot(page, info, 'junction');

  // zoom with the wheel, pan with the arrow keys and with Space held while dragging
  const before = await state(page);
  const mid = await screenOf(page, 200, 100);
  await page.mouse.move(mid.x, mid.y);
  await page.mouse.wheel(0, -300);
  await expect.poll(async () => (await state(page)).zoom).toBeGreaterThan(before.zoom);
  const zoomed = await state(page);
  await page.keyboard.press('ArrowLeft');
  expect((await state(page)).viewX).toBe(zoomed.viewX + 60);
  await page.keyboard.down(' ');
  await page.mouse.move(mid.x, mid.y);
  await page.mouse.down();
  await page.mouse.move(mid.x + 80, mid.y, { steps: 4 });
  await page.mouse.up();
  await page.keyboard.up(' ');
  expect((await state(page)).viewX).toBeCloseTo(zoomed.viewX + 60 + 80, 0);
  expect((await state(page)).parts.map((p) => [p.x, p.y])).toEqual(before.parts.map((p) => [p.x, p.y])); // panning moved nothing
});
