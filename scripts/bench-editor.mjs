#!/usr/bin/env node
/**
 * Editor benchmark in Chromium (prints figures; not a pass/fail test).
 *  - edit-to-overlay latency: from the key event of an edit (swap a winding's
 *    dot; the event's own time stamp) to the overlay drawn into its canvas with
 *    the new solve, median and 95th percentile, on generated sheets of about
 *    20, 200 and 1000 parts; edits are spaced 120 ms apart;
 *  - frame rate while dragging a part on the 1000-part sheet;
 *  - gzip size of the production bundle's first load.
 * Run after `npm run build`:  node scripts/bench-editor.mjs
 */
import { chromium } from '@playwright/test';
import { spawn } from 'node:child_process';
import { readFileSync, writeFileSync, mkdtempSync, rmSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { join } from 'node:path';
import { tmpdir } from 'node:os';

const PORT = Number(process.env.E2E_PORT) || 4179;
const ROOT = new URL('..', import.meta.url).pathname;

/** A sheet of repeated cells: source, series resistor, coupled pair, load, ground (6 parts a cell). */
function generatedSheet(targetParts) {
  const cells = Math.max(1, Math.round(targetParts / 6));
  const parts = [], wires = [], couplings = [];
  let n = 0;
  const id = (p) => `${p}:b${(n++).toString(36)}`;
  const P = (kind, ref, x, y, rot, extra = {}) => { const p = { id: id('part'), kind, x, y, rot, mirror: false, ref, ...extra }; parts.push(p); return p; };
  const W = (...pts) => wires.push({ id: id('wire'), pts });
  const perRow = Math.ceil(Math.sqrt(cells * 1.6));
  for (let c = 0; c < cells; c++) {
    const ox = (c % perRow) * 280, oy = Math.floor(c / perRow) * 240;
    P('vsource', `V${c + 1}`, ox, oy + 100, 1, { value: 10, phaseDeg: 0 });
    P('resistor', `R${2 * c + 1}`, ox + 60, oy + 70, 0, { value: 10 });
    const l1 = P('winding', `L${2 * c + 1}`, ox + 120, oy + 100, 1, { value: 0.01, dot: 'first' });
    const l2 = P('winding', `L${2 * c + 2}`, ox + 160, oy + 100, 1, { value: 0.02, dot: 'first' });
    P('resistor', `R${2 * c + 2}`, ox + 200, oy + 100, 1, { value: 100 });
    P('ground', '', ox, oy + 160, 0);
    W(ox, oy + 70, ox + 30, oy + 70);
    W(ox + 90, oy + 70, ox + 120, oy + 70);
    W(ox, oy + 130, ox, oy + 160);
    W(ox + 120, oy + 130, ox + 120, oy + 160, ox, oy + 160);
    W(ox + 160, oy + 70, ox + 200, oy + 70);
    W(ox + 200, oy + 130, ox + 160, oy + 130);
    W(ox + 160, oy + 130, ox + 160, oy + 160, ox + 120, oy + 160);
    couplings.push({ id: id('coupling'), ref: `K${c + 1}`, windings: [l1.id, l2.id], by: 'k', value: 0.9 });
  }
  return { schema: 'coilwright.sheet/3', title: `Generated ${parts.length} parts`, frequencyHz: 1000, amplitudes: 'rms', parts, wires, couplings };
}

function quantile(xs, q) {
  const s = [...xs].sort((a, b) => a - b);
  const i = Math.min(s.length - 1, Math.max(0, Math.ceil(q * s.length) - 1));
  return s[i];
}

function firstLoadGzip() {
  const dist = join(ROOT, 'dist');
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const refs = [...html.matchAll(/(?:src|href)="\/?([^"]+\.(?:js|css))"/g)].map((m) => m[1]);
  let total = gzipSync(html).length;
  const files = [];
  for (const r of refs) {
    const size = gzipSync(readFileSync(join(dist, r))).length;
    files.push([r, size]);
    total += size;
  }
  const workerFile = readFileSync(join(dist, refs.find((r) => r.endsWith('.js'))), 'utf8').match(/assets\/solve\.worker-[\w-]+\.js/);
  const worker = workerFile ? gzipSync(readFileSync(join(dist, workerFile[0]))).length : 0;
  return { total, files, worker };
}

async function main() {
  const server = spawn('npx', ['vite', 'preview', '--port', String(PORT), '--strictPort'], { cwd: ROOT, stdio: 'ignore', detached: true });
  await new Promise((r) => setTimeout(r, 2500));
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const dir = mkdtempSync(join(tmpdir(), 'coilwright-bench-'));
  try {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    await page.goto(`http://localhost:${PORT}/`);
    await page.waitForFunction(() => window.__coilwright?.state().solve.status === 'solved');
    await page.getByTestId('sheet-canvas').waitFor();
    await page.waitForTimeout(200);
    await page.evaluate(() => {
      window.__lastKey = 0;
      window.addEventListener('keydown', (e) => { window.__lastKey = e.timeStamp; }, { capture: true });
    });
    for (const target of [20, 200, 1000]) {
      const sheet = generatedSheet(target);
      const file = join(dir, `bench-${target}.json`);
      writeFileSync(file, JSON.stringify(sheet));
      const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: /^Open file/ }).click()]);
      await chooser.setFiles(file);
      await page.waitForFunction((n) => {
        const s = window.__coilwright.state();
        return s.sheet.parts.length === n && s.solve.status === 'solved' && s.solve.circuit?.source === s.sheet;
      }, sheet.parts.length, { timeout: 60_000 });
      // select the first secondary winding by clicking it, then swap its dot repeatedly
      const at = await page.evaluate(() => {
        const s = window.__coilwright.state();
        const l = s.sheet.parts.find((p) => p.ref === 'L2');
        return window.__coilwright.toScreen(l.x, l.y);
      });
      const box = await page.getByTestId('sheet-canvas').boundingBox();
      await page.mouse.click(box.x + at.x, box.y + at.y);
      const lat = [];
      const runs = target >= 1000 ? 40 : 60;
      for (let i = 0; i < runs + 5; i++) {
        // edits come one at a time, as a person makes them: let the previous frame settle first
        await page.waitForTimeout(120);
        const before = await page.evaluate(() => window.__coilwright.state().solve.seq);
        await page.keyboard.press('d');
        const ms = await page.waitForFunction((b) => {
          const o = window.__coilwright.overlay;
          return o.seq > b && o.at >= window.__lastKey ? o.at - window.__lastKey : false;
        }, before, { timeout: 30_000, polling: 'raf' });
        if (i >= 5) lat.push(await ms.jsonValue());
      }
      console.log(`edit-to-overlay, ${sheet.parts.length} parts: median ${quantile(lat, 0.5).toFixed(1)} ms, p95 ${quantile(lat, 0.95).toFixed(1)} ms (${lat.length} edits)`);

      if (target === 1000) {
        // press on the part with the real mouse, then move the pointer once per display frame from inside the page
        await page.mouse.move(box.x + at.x, box.y + at.y);
        await page.mouse.down();
        const r = await page.evaluate(async ([x0, y0]) => {
          const el = document.querySelector('[data-testid="sheet-canvas"]');
          const probe = window.__coilwright.sheetDraws;
          const d0 = probe.draws, ms0 = probe.ms;
          const gaps = [];
          let last = performance.now();
          const t0 = last;
          for (let k = 0; k < 150; k++) {
            await new Promise((res) => requestAnimationFrame(res));
            const now = performance.now();
            gaps.push(now - last);
            last = now;
            el.dispatchEvent(new PointerEvent('pointermove', { bubbles: true, clientX: x0 + 2 * k, clientY: y0 + (k % 30), pointerId: 1, button: -1, buttons: 1 }));
          }
          await new Promise((res) => requestAnimationFrame(res));
          const secs = (performance.now() - t0) / 1000;
          return { frames: probe.draws - d0, secs, ms: probe.ms - ms0, gaps };
        }, [box.x + at.x, box.y + at.y]);
        await page.mouse.up();
        const sorted = [...r.gaps].sort((a, b) => a - b);
        console.log(`drag on ${sheet.parts.length} parts: ${(r.frames / r.secs).toFixed(1)} frames/s (${r.frames} sheet redraws in ${r.secs.toFixed(2)} s; frame gap median ${sorted[Math.floor(sorted.length / 2)].toFixed(1)} ms, p95 ${quantile(r.gaps, 0.95).toFixed(1)} ms; ${(r.ms / Math.max(1, r.frames)).toFixed(2)} ms drawing the sheet each)`);
      }
    }
  } finally {
    await browser.close();
    rmSync(dir, { recursive: true, force: true });
    try { process.kill(-server.pid); } catch { /* already gone */ }
  }
  const g = firstLoadGzip();
  console.log(`first load (gzip): ${(g.total / 1024).toFixed(1)} KB [${g.files.map(([f, s]) => `${f} ${(s / 1024).toFixed(1)} KB`).join(', ')}]; solve worker fetched at start: ${(g.worker / 1024).toFixed(1)} KB more`);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
