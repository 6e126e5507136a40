/**
 * The practitioner's points, each tried as a user would: with the pointer
 * and the keyboard, reading what the editor shows and checking it against
 * the sheet's own numbers and closed forms.
 */
import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { shot } from './helpers';

const state = (page: Page) => page.evaluate(() => (window as any).__coilwright.state());

async function example(page: Page, key: string) {
  await page.getByRole('button', { name: /Sheets/ }).click();
  await page.locator(`[data-example="${key}"]`).click();
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
}

/** Select a part by clicking between its two pins on the drawing. */
async function clickPart(page: Page, ref: string) {
  const box = (await page.getByTestId('sheet-canvas').boundingBox())!;
  const [a, b] = await page.evaluate((r) => [(window as any).__coilwright.pinOnScreen(r, 0), (window as any).__coilwright.pinOnScreen(r, 1)], ref);
  await page.mouse.click(box.x + (a.x + b.x) / 2, box.y + (a.y + b.y) / 2);
  await expect.poll(async () => { const s = await state(page); return s.sheet.parts.find((p: any) => p.id === s.selection[0])?.ref; }).toBe(ref);
}

/** Show an analysis view (its tab toggles it: pressed only when it is not shown yet). */
async function openView(page: Page, name: RegExp) {
  const tab = page.getByRole('toolbar', { name: 'Analysis views' }).getByRole('button', { name });
  if ((await tab.getAttribute('aria-pressed')) !== 'true') await tab.click();
  await expect(tab).toHaveAttribute('aria-pressed', 'true');
}

/** Expand the notices strip when it is not expanded yet. */
async function expandNotices(page: Page) {
  const toggle = page.getByTestId('notices-toggle');
  if ((await toggle.getAttribute('aria-expanded')) !== 'true') await toggle.click();
}

/** A graph model opened as a file, the way a user picks one. */
async function openGraph(page: Page, graph: unknown, name = 'model.json') {
  await page.getByTestId('file-input').setInputFiles({ name, mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(graph)) });
  await expect(page.getByTestId('message')).toContainText(`Opened ${name}`);
}

test('2: an open current-transformer secondary is named, with its caution first and pointing at the part', async ({ page }, info) => {
  await page.goto('/');
  // 100 A through an ideal 1:200 transformer into a 0.5 Ω burden (a current transformer, common practice)
  await openGraph(page, {
    schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd',
    elements: [
      { id: 'Iline', kind: 'current-source', nodes: ['p', 'gnd'], magnitude: 100, phaseDeg: 0 },
      { id: 'T1', kind: 'ideal-transformer', nodes: ['p', 'gnd', 's', 'gnd'], ratio: 1 / 200 },
      { id: 'Rb', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 0.5 },
    ],
  }, 'ct.json');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  // with the burden: I = 100 A / 200 = 0.5 A in it (ideal transformer, ampere-turn balance)
  await expect.poll(async () => Number(await page.locator('[data-testid="readings-parts"] tr[data-name="Rb"] td[data-col="i"]').getAttribute('data-mag'))).toBeCloseTo(0.5, 9);
  await expect(page.getByTestId('caution-open-secondary')).toHaveCount(0);
  // remove the burden: pick it on the drawing, Delete
  await page.getByRole('toolbar', { name: 'Edit and view' }).getByRole('button', { name: /^Show all/ }).click();
  await clickPart(page, 'Rb');
  await page.keyboard.press('Delete');
  const caution = page.getByTestId('caution-open-secondary');
  await expect(caution).toContainText('Open current-transformer secondary');
  await expect(caution).toContainText('T1');
  await expect(caution).toContainText('local codes and licensed practice');
  // it leads the strip, before the refusal
  await expect(page.locator('.notices .notice').first()).toHaveAttribute('data-testid', 'caution-open-secondary');
  // and points at the part: Show selects the transformer
  await caution.getByRole('button', { name: 'Show' }).click();
  await expect.poll(async () => { const s = await state(page); return s.sheet.parts.find((p: any) => p.id === s.selection[0])?.kind; }).toBe('transformer');
  // the removed part is not in the readings
  await expect(page.locator('[data-testid="readings-parts"] tr[data-name="Rb"]')).toHaveCount(0);
  await shot(page, info, 'open-ct-secondary');

  // with coupled windings: the example's burden removed; the caution's voltage reads as every other number does
  await example(page, 'current-transformer');
  await clickPart(page, 'Rburden');
  await page.keyboard.press('Delete');
  const coupled = page.getByTestId('caution-open-winding');
  await expect(coupled).toContainText('Lsec');
  const text = (await coupled.textContent())!;
  expect(text).not.toMatch(/\de[+-]\d/); // no exponent notation: engineering prefixes as elsewhere
  expect(text).toMatch(/\d(\.\d+)? [kM]?V RMS/);
  await expect(page.locator('.notices .notice').first()).toHaveAttribute('data-testid', 'caution-open-winding');
});

test('4: the source\'s power factor is lagging when it sees an inductive load, and agrees with P and Q', async ({ page }) => {
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await openView(page, /^Power balance/);
  await expect(page.getByTestId('power-panel')).toContainText('lagging when the current lags the voltage');
  const pf = (await page.getByTestId('pf-Vmains').textContent())!;
  // the source delivers Q > 0 into an inductive load (magnetising inductance): the current lags, pf lagging (common practice)
  const r = (await state(page)).solve.result.elements.Vmains;
  expect(r.power.vars).toBeLessThan(0); // absorbed Q of the source is negative: it delivers Q
  expect(pf).toContain('lagging');
  // pf = |P| / |S| (definition)
  expect(Number(pf.split(' ')[0])).toBeCloseTo(Math.abs(r.power.watts) / Math.hypot(r.power.watts, r.power.vars), 3);
  // the impedance the source sees, V / I out of its + terminal, has a positive angle (inductive)
  const v = r.voltage, i = { re: -r.current.re, im: -r.current.im };
  const zAngle = Math.atan2(v.im * i.re - v.re * i.im, v.re * i.re + v.im * i.im);
  expect(zAngle).toBeGreaterThan(0);
});

test('6: phasor labels stay clear of arrows, axes and each other; a short phasor keeps a visible shaft', async ({ page }, info) => {
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await openView(page, /^Phasors/);
  const diagram = page.getByTestId('phasor-diagram');
  await expect(diagram.locator('g[data-label]')).toHaveCount(4);
  // I(Rcore) is 9 mA against a 5 A scale: far shorter than an arrowhead at scale
  await page.getByRole('combobox', { name: 'Quantity to draw' }).selectOption({ label: 'I(Rcore)' });
  await expect(diagram.locator('g[data-label]')).toHaveCount(5);
  const short = diagram.locator('g[data-label="I(Rcore)"]');
  await expect(short).toHaveAttribute('data-lengthened', 'true');
  const ends = await short.locator('line').evaluateAll((ls) => ls.map((l) => [Number(l.getAttribute('x2')), Number(l.getAttribute('y2'))]));
  expect(Math.hypot(...ends[ends.length - 1])).toBeGreaterThanOrEqual(29.9);
  // every label box against every other, both axes and every arrow (from the diagram's own coordinates)
  const facts = await diagram.evaluate((svg) => {
    const boxes = [...svg.querySelectorAll('text.phasor-label')].map((t) => t.getAttribute('data-box')!.split(' ').map(Number));
    const arrows = [...svg.querySelectorAll('g[data-label] line')].map((l) => ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a))));
    const axes = [...svg.querySelectorAll('line[data-axis]')].map((l) => ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a))));
    return { boxes, arrows, axes };
  });
  expect(facts.boxes.length).toBeGreaterThanOrEqual(4);
  const hits = (s: number[], b: number[]) => {
    // sample the segment finely (the boxes are 12 units tall, the samples 0.5 apart)
    const n = Math.ceil(Math.hypot(s[2] - s[0], s[3] - s[1]) / 0.5) + 1;
    for (let k = 0; k <= n; k++) {
      const x = s[0] + ((s[2] - s[0]) * k) / n, y = s[1] + ((s[3] - s[1]) * k) / n;
      if (x > b[0] && x < b[2] && y > b[1] && y < b[3]) return true;
    }
    return false;
  };
  for (let i = 0; i < facts.boxes.length; i++) {
    const a = facts.boxes[i];
    for (let j = i + 1; j < facts.boxes.length; j++) {
      const b = facts.boxes[j];
      expect(Math.min(a[2], b[2]) <= Math.max(a[0], b[0]) || Math.min(a[3], b[3]) <= Math.max(a[1], b[1])).toBe(true);
    }
    for (const s of [...facts.axes, ...facts.arrows]) expect(hits(s, a)).toBe(false);
  }
  await diagram.scrollIntoViewIfNeeded();
  await shot(page, info, 'phasors-1024');
});

test('7: the T-equivalent has arms of its own names, no dots, wires, the tables\' precision; Escape closes it', async ({ page }, info) => {
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  const before = await state(page);
  await openView(page, /^T-equivalent/);
  const shunt = (await page.locator('[data-testid="t-arms"] tr[data-arm="shunt"] td').textContent())!;
  await page.getByTestId('t-draw').click();
  await expect(page.getByTestId('t-drawn')).toBeVisible();
  const after = await state(page);
  const arms = after.sheet.parts.filter((p: any) => p.kind === 'arm');
  expect(arms).toHaveLength(3);
  for (const a of arms) {
    expect(['Lp', 'Ls']).not.toContain(a.ref); // names of their own
    expect(a.dot).toBeUndefined(); // uncoupled: no polarity dots
  }
  expect(after.sheet.wires.length).toBeGreaterThan(before.sheet.wires.length - 1); // joined by wires
  expect(after.sheet.parts.some((p: any) => p.kind === 'label' && !before.sheet.parts.some((q: any) => q.id === p.id))).toBe(false); // not by net labels
  // the drawing writes the shunt arm as the table does (the SVG carries the drawing's own text)
  await page.getByTestId('sheet-canvas').focus();
  const [dl] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Control+Shift+S')]);
  const svg = readFileSync((await dl.path())!, 'utf8');
  expect(svg).toContain(`${shunt} (equivalent)`);
  await shot(page, info, 't-equivalent-drawn');
  // Escape in the view closes it
  await page.getByTestId('t-panel').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('analysis-dock')).toHaveCount(0);
});

test('9: messages speak of the sheet; rounding shows as 0; one angle range', async ({ page }) => {
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await page.getByTestId('sheet-canvas').focus();
  // a ground before any wire
  await page.keyboard.press('Alt+n');
  await page.keyboard.press('7');
  await page.keyboard.press('Enter');
  await expandNotices(page);
  const notes = page.getByTestId('notices');
  await expect(notes).toContainText('The ground symbol is not wired to any part yet');
  await expect(notes).not.toContainText('model');
  await expect(notes).not.toContainText('set "ground"');
  // an isolated section is called that, once
  await example(page, 'wireless');
  await expandNotices(page);
  await expect(page.getByTestId('warning')).toContainText('Isolated section:');
  await expect(page.getByTestId('warning')).not.toContainText(/isolated part:/i);
  // an open primary: the secondary's rounding residue reads 0, never a femto-something
  await example(page, 'isolation');
  await clickPart(page, 'Rp');
  await page.keyboard.press('Delete');
  await expect.poll(async () => (await state(page)).solve.result?.elements?.Rp).toBeUndefined();
  const table = page.getByTestId('readings-parts');
  await expect(table.locator('tr[data-name="Ls"] td[data-col="i"]')).toHaveAttribute('data-mag', '0');
  const all = (await table.textContent())! + (await page.getByTestId('readings-nodes').textContent().catch(() => ''));
  expect(all).not.toMatch(/\d [fpa](A|V|W|var)\b/); // no femto-, pico- or atto- residue
  expect(all).not.toMatch(/NaN|Infinity|null/);
  expect(all).not.toContain('∠-180'); // angles in (−180°, 180°]
});

test('10: sweep settings and traces, undo steps and sheet names survive a reload and a switch', async ({ page }, info) => {
  await page.goto('/');
  await example(page, 'wireless');
  await openView(page, /^Sweep/);
  await page.getByTestId('sweep-quantity').selectOption({ label: 'I(Rbat) current' });
  await page.getByTestId('sweep-add').click();
  await page.getByTestId('sweep-points').fill('123');
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  const wirelessId = (await state(page)).sheetId;
  // an edit to undo later: Rbat's value typed
  await clickPart(page, 'Rbat');
  await page.keyboard.press('v');
  await page.keyboard.type('12');
  await page.keyboard.press('Enter');
  await expect.poll(async () => (await state(page)).sheet.parts.find((p: any) => p.ref === 'Rbat').value).toBe(12);

  // a new sheet is numbered, and renamed in the sheet list
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Alt+n');
  await expect.poll(async () => (await state(page)).sheet.title).toMatch(/^Sheet \d+$/);
  await page.keyboard.press('4');
  await page.keyboard.press('Enter');
  await page.getByRole('button', { name: /Sheets/ }).click();
  const title = (await state(page)).sheet.title;
  await page.getByRole('button', { name: `Rename ${title}` }).click();
  await page.getByTestId('rename-input').fill('Bench supply');
  await page.getByTestId('rename-input').press('Enter');
  await expect.poll(async () => (await state(page)).sheet.title).toBe('Bench supply');
  await expect(page.locator('[data-testid="kept-sheet"]').filter({ hasText: 'Bench supply' })).toHaveCount(1);
  // back to the wireless pair from the list: its sweep comes back with its traces and runs again
  await page.locator(`[data-testid="kept-sheet"][data-id="${wirelessId}"] [role="menuitem"]`).click();
  await expect.poll(async () => (await state(page)).sheetId).toBe(wirelessId);
  await openView(page, /^Sweep/);
  await expect(page.getByTestId('sweep-trace')).toHaveCount(2);
  await expect(page.getByTestId('sweep-points')).toHaveValue('123');
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');

  // a reload: the same sheet, its sweep and its undo steps
  await page.reload();
  await expect.poll(async () => (await state(page)).sheetId).toBe(wirelessId);
  await expect.poll(async () => (await state(page)).tab.state).toBe('own');
  await openView(page, /^Sweep/);
  await expect(page.getByTestId('sweep-trace')).toHaveCount(2);
  await expect(page.getByTestId('sweep-points')).toHaveValue('123');
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  await expect(page.getByTestId('plot-magnitude')).toBeVisible();
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Control+z');
  // the example's own load is back (8 Ω, the wireless example)
  await expect.poll(async () => (await state(page)).sheet.parts.find((p: any) => p.ref === 'Rbat').value).toBe(8);
  await shot(page, info, 'after-reload');
});

test('11: the SVG sheet lists the couplings, the ISO 7200 fields and reads at 2.5 mm', async ({ page }) => {
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await page.getByTestId('sheet-canvas').focus();
  const [dl] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Control+Shift+S')]);
  const svg = readFileSync((await dl.path())!, 'utf8');
  const view = await page.context().newPage();
  await view.setContent(svg);
  const facts = await view.evaluate(() => {
    const texts = (sel: string) => [...document.querySelectorAll(`${sel} text`)].map((t) => ({ text: t.textContent ?? '', size: Number(t.getAttribute('font-size') ?? (t.closest('[font-size]') as Element | null)?.getAttribute('font-size')) }));
    // lines joined with a space, so a phrase wrapped over two lines reads whole
    const all = [...document.querySelectorAll('text')].map((t) => t.textContent ?? '').join(' ');
    return { cautions: texts('#cautions'), block: texts('#title-block'), couplings: all, all };
  });
  // the couplings: both inductances, M, k and the effective turns ratio (field notes)
  expect(facts.couplings).toMatch(/Lp = 3\.2 H/);
  expect(facts.couplings).toMatch(/M\(Lp,Ls\) = 3\.194 H/); // M = k·√(L1·L2) = 0.998 · 3.2 H (field notes)
  expect(facts.couplings).toMatch(/k\(Lp,Ls\) = 0\.998/);
  expect(facts.couplings).toMatch(/turns/i);
  // the ISO 7200 data fields (ISO 7200: revision, sheet number, creator, approval person)
  for (const field of ['Revision', 'Sheet', 'Drawn by', 'Checked by']) expect(facts.block.map((t) => t.text)).toContain(field);
  // caution and title-block text at 2.5 mm or more (common practice for drawings; the sheet's units are mm)
  for (const t of [...facts.cautions, ...facts.block]) expect(t.size, t.text).toBeGreaterThanOrEqual(2.5);
  // the demo's core loss and load hang isolated from the primary: measured from their own reference
  expect(facts.all).not.toContain('node voltages to gnd');
  expect(facts.all).toContain("node voltages from each section's own reference node");
  await view.close();
});

test('12: magnitudes in dB name their reference; the zoom keys keep the middle and the drawing in view', async ({ page }) => {
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await openView(page, /^Sweep/);
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  // Z seen by the source: dB re 1 Ω (common practice)
  await expect(page.getByTestId('plot-magnitude').locator('svg')).toContainText('magnitude (dBΩ)');
  await page.getByTestId('sweep-quantity').selectOption({ label: 'I(Rload) current' });
  await page.getByTestId('sweep-per').selectOption({ label: 'I(Vmains) current' });
  await page.getByTestId('sweep-add').click();
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  await expect(page.locator('.legend')).toContainText('I(Rload) / I(Vmains) (dB)'); // a ratio of like quantities: plain dB
  await expect(page.locator('.legend')).toContainText('Z seen by Vmains (dBΩ)');
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('analysis-dock')).toHaveCount(0);

  const canvas = page.getByTestId('sheet-canvas');
  await canvas.focus();
  // the view's own size (the drawing area's whole pixels)
  const size = await page.evaluate(() => { const el = document.querySelector('.canvas-box')!; return { width: el.clientWidth, height: el.clientHeight }; });
  const centre = async () => {
    const v = (await state(page)).view;
    return { x: (size.width / 2 - v.x) / v.zoom, y: (size.height / 2 - v.y) / v.zoom };
  };
  const c0 = await centre();
  const z0 = (await state(page)).view.zoom;
  for (let i = 0; i < 4; i++) await page.keyboard.press('=');
  const c1 = await centre();
  // zoomed about the middle of the view: the sheet point there stays there (geometry of a scaling about a point)
  expect((await state(page)).view.zoom).toBeCloseTo(z0 * 1.25 ** 4, 9);
  expect(Math.hypot(c1.x - c0.x, c1.y - c0.y)).toBeLessThan(1e-6);
  for (let i = 0; i < 4; i++) await page.keyboard.press('-');
  expect((await state(page)).view.zoom).toBeCloseTo(z0, 9);
  // the drawing moved off to one side with the arrow keys: zooming in still keeps a part in view
  for (let i = 0; i < 6; i++) await page.keyboard.press('ArrowRight');
  for (let i = 0; i < 10; i++) await page.keyboard.press('=');
  const inView = await page.evaluate(([w, h]) => {
    const cw = (window as any).__coilwright;
    return cw.state().sheet.parts.filter((p: any) => { const s = cw.toScreen(p.x, p.y); return s.x >= 0 && s.x <= w && s.y >= 0 && s.y <= h; }).length;
  }, [size.width, size.height]);
  expect(inView).toBeGreaterThan(0);
  // the symbol-standard button says which standard is shown
  const symbols = page.locator('button[data-command="symbols"]');
  await expect(symbols).toHaveText('Symbols: IEC 60617');
  // and it is whole inside the 1024 px window (it was cut off there)
  const sb = (await symbols.boundingBox())!;
  expect(sb.x).toBeGreaterThanOrEqual(0);
  expect(sb.x + sb.width).toBeLessThanOrEqual(1024);
  expect(await symbols.evaluate((el) => el.scrollWidth <= el.clientWidth)).toBe(true);
});

test('3: the sweep plot fits its pane at 1024×768: every tick and label inside the picture', async ({ page }) => {
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await openView(page, /^Sweep/);
  await page.getByTestId('sweep-from').fill('10');
  await page.getByTestId('sweep-to').fill('10k');
  await page.getByTestId('sweep-to').press('Enter');
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-status')).toHaveAttribute('data-status', 'done');
  for (const id of ['plot-magnitude', 'plot-phase']) {
    const pane = (await page.locator('.dock-body').boundingBox())!;
    const svg = page.getByTestId(id).locator('svg');
    const box = (await svg.boundingBox())!;
    expect(box.x).toBeGreaterThanOrEqual(pane.x - 0.5);
    expect(box.x + box.width).toBeLessThanOrEqual(pane.x + pane.width + 0.5);
    // every text's drawn box inside the SVG's box
    const outside = await svg.evaluate((el) => {
      const r = el.getBoundingClientRect();
      return [...el.querySelectorAll('text')].filter((t) => { const b = t.getBoundingClientRect(); return b.left < r.left - 0.5 || b.right > r.right + 0.5 || b.top < r.top - 0.5 || b.bottom > r.bottom + 0.5; }).map((t) => t.textContent);
    });
    expect(outside).toEqual([]);
  }
  // the 10 kHz tick is there
  await expect(page.getByTestId('plot-magnitude').locator('text[data-tick="10000"]')).toHaveText('10 kHz');
});

test('5: parts placed by number key land at free spots beside the last one, not on top of each other', async ({ page }) => {
  await page.goto('/');
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Alt+n');
  for (let i = 0; i < 3; i++) {
    await page.keyboard.press('4');
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await state(page)).sheet.parts.length).toBe(i + 1);
  }
  const parts = (await state(page)).sheet.parts as { x: number; y: number }[];
  // three distinct places, each within a few grid steps of the one before (beside the last one)
  const keys = new Set(parts.map((p) => `${p.x},${p.y}`));
  expect(keys.size).toBe(3);
  for (let i = 1; i < parts.length; i++) {
    const d = Math.hypot(parts[i].x - parts[i - 1].x, parts[i].y - parts[i - 1].y);
    expect(d).toBeGreaterThan(0);
    expect(d).toBeLessThan(400);
  }
});

test('3: notices fold into one strip with counts that expands on demand; each view opens at its top', async ({ page }) => {
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto('/');
  await example(page, 'wireless');
  const strip = page.getByTestId('notices');
  const notes = (await state(page)).solve.result.warnings.length;
  expect(notes).toBeGreaterThan(0);
  // folded: one count line naming how many notes there are, no note bars
  await expect(page.getByTestId('notice-counts')).toContainText(`${notes} note${notes === 1 ? '' : 's'}`);
  await expect(page.getByTestId('warning')).toHaveCount(0);
  const folded = (await strip.boundingBox())!.height;
  // on demand: every note listed
  await page.getByTestId('notices-toggle').click();
  await expect(page.getByTestId('warning')).toHaveCount(notes);
  expect((await strip.boundingBox())!.height).toBeGreaterThan(folded);
  await page.getByTestId('notices-toggle').click();
  await expect(page.getByTestId('warning')).toHaveCount(0);
  // a view scrolled down, then another view: it starts at its top
  await openView(page, /^Power balance/);
  await page.locator('.dock-body').evaluate((el) => { el.scrollTop = el.scrollHeight; });
  await openView(page, /^Phasors/);
  await expect.poll(() => page.locator('.dock-body').evaluate((el) => el.scrollTop)).toBe(0);
});

test('10: the new-sheet notice goes with its sheet; a long title keeps the top bar on one line', async ({ page }) => {
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  const barHeight = (await page.locator('.topbar').boundingBox())!.height;
  await page.getByTestId('sheet-canvas').focus();
  await page.keyboard.press('Alt+n');
  await expect(page.getByTestId('message')).toContainText('New empty sheet');
  // another sheet: the notice about the empty one is gone
  await example(page, 'wireless');
  await expect(page.getByTestId('message').filter({ hasText: 'New empty sheet' })).toHaveCount(0);
  // a long title, given in the sheet list
  await page.getByRole('button', { name: /Sheets/ }).click();
  const title = (await state(page)).sheet.title;
  await page.getByRole('button', { name: `Rename ${title}` }).click();
  await page.getByTestId('rename-input').fill('Wireless charging pad, 85 kHz, series-series compensation, bench prototype revision three for the lab');
  await page.getByTestId('rename-input').press('Enter');
  await expect.poll(async () => (await state(page)).sheet.title).toMatch(/^Wireless charging pad/);
  await page.keyboard.press('Escape');
  expect((await page.locator('.topbar').boundingBox())!.height).toBeCloseTo(barHeight, 0);
  // the title itself is one line, cut with an ellipsis, and every top-bar control sits inside the bar
  const bar = (await page.locator('.topbar').boundingBox())!;
  const shown = page.locator('.topbar > .sheet-title');
  await expect(shown).toContainText('Wireless charging pad');
  const lineHeight = await shown.evaluate((el) => parseFloat(getComputedStyle(el).lineHeight) || parseFloat(getComputedStyle(el).fontSize) * 1.5);
  expect((await shown.boundingBox())!.height).toBeLessThanOrEqual(lineHeight + 1);
  for (const b of await page.locator('.topbar button').all()) {
    const r = await b.boundingBox();
    if (r) expect(r.y + r.height).toBeLessThanOrEqual(bar.y + bar.height + 0.5);
  }
});

test('6: tags stay inside the view when the drawing is larger than it; the drawing\'s text is about 11 px at 100 % zoom', async ({ page }) => {
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto('/');
  await expect.poll(async () => (await state(page)).solve.status).toBe('solved');
  await page.getByRole('toolbar', { name: 'Edit and view' }).getByRole('button', { name: /^Show all/ }).click();
  // the drawing's text in sheet units, which is screen px at 100 % zoom: designators, values, tags, couplings, node names
  await expect.poll(async () => (await page.evaluate(() => (window as any).__coilwright.textSizes())).length).toBeGreaterThan(1);
  const sizes: number[] = await page.evaluate(() => (window as any).__coilwright.textSizes());
  for (const s of sizes) {
    expect(s).toBeGreaterThanOrEqual(10);
    expect(s).toBeLessThanOrEqual(12);
  }
  expect(sizes).toContain(11);
  // closer and closer about the middle: the drawing outgrows the view, and every tag drawn stays inside it
  const canvas = page.getByTestId('sheet-canvas');
  await canvas.focus();
  const z0 = (await state(page)).view.zoom;
  for (let i = 0; i < 4; i++) await page.keyboard.press('=');
  await expect.poll(async () => (await state(page)).view.zoom).toBeCloseTo(z0 * 1.25 ** 4, 9);
  // the view's own size (the drawing area's whole pixels)
  const box = await page.evaluate(() => { const el = document.querySelector('.canvas-box')!; return { width: el.clientWidth, height: el.clientHeight }; });
  await expect.poll(async () => (await page.evaluate(() => (window as any).__coilwright.tags())).length).toBeGreaterThan(0);
  const onScreen: { x0: number; y0: number; x1: number; y1: number; text: string }[] = await page.evaluate(() => {
    const w = (window as any).__coilwright;
    return w.tags().map((b: any) => {
      const a = w.toScreen(b.x0, b.y0), c = w.toScreen(b.x1, b.y1);
      return { x0: a.x, y0: a.y, x1: c.x, y1: c.y, text: b.text };
    });
  });
  for (const t of onScreen) {
    expect(t.x0, `${t.text} left`).toBeGreaterThanOrEqual(0);
    expect(t.y0, `${t.text} top`).toBeGreaterThanOrEqual(0);
    expect(t.x1, `${t.text} right`).toBeLessThanOrEqual(box.width);
    expect(t.y1, `${t.text} bottom`).toBeLessThanOrEqual(box.height);
  }
});
