import { expect, test } from '@playwright/test';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { EMBED_NS, sheetToSvg } from '../src/export';
import { EXAMPLES, seedIds, sheetToGraph } from '../src/model';
import { solveGraph } from '../src/solver';

/**
 * The exported sheet of the isolation-transformer example as Chromium renders
 * it: it parses as SVG, its text stays text that fits the boxes drawn for it,
 * the sheet is embedded in our namespace, and the picture matches the stored
 * reference within a tolerance. The SVG is opened as a file; no app server is
 * needed for this spec.
 */

function isolationSvg(): string {
  seedIds(1);
  const sheet = EXAMPLES.find((e) => e.key === 'isolation')!.make();
  return sheetToSvg(sheet, solveGraph(sheetToGraph(sheet)), { date: '2026-12-01', version: '0.1.0', notes: 'Bench unit, 1:1, 10 µF across the load.' });
}

test('the isolation-transformer sheet renders cleanly in Chromium', async ({ page }, info) => {
  const dir = mkdtempSync(join(tmpdir(), 'coilwright-svg-'));
  const file = join(dir, 'isolation.svg');
  writeFileSync(file, isolationSvg());
  // the document is A4 landscape less 10.5 mm print margins, 276 mm × 189 mm: 1043 × 714 px at 96 px per inch (CSS reference pixel)
  await page.setViewportSize({ width: 1044, height: 715 });
  await page.goto(pathToFileURL(file).href);

  const facts = await page.evaluate((ns) => {
    const svg = document.documentElement as unknown as SVGSVGElement;
    const texts = [...document.querySelectorAll('text')] as SVGTextElement[];
    const outside: string[] = [];
    const vb = svg.viewBox.baseVal;
    for (const t of texts) {
      const b = t.getBBox();
      const m = (t.closest('g[transform]') as SVGGraphicsElement | null)?.transform.baseVal.consolidate()?.matrix;
      const x0 = m ? m.a * b.x + m.e : b.x, x1 = m ? m.a * (b.x + b.width) + m.e : b.x + b.width;
      const y0 = m ? m.d * b.y + m.f : b.y, y1 = m ? m.d * (b.y + b.height) + m.f : b.y + b.height;
      if (x0 < vb.x || y0 < vb.y || x1 > vb.x + vb.width || y1 > vb.y + vb.height) outside.push(t.textContent ?? '');
    }
    // each reading tag's text inside its background box
    const spill: string[] = [];
    for (const t of document.querySelectorAll('text.tag-i, text.tag-v') as NodeListOf<SVGTextElement>) {
      const r = (t.previousElementSibling as SVGRectElement).getBBox();
      const b = t.getBBox();
      if (b.x < r.x - 0.5 || b.x + b.width > r.x + r.width + 0.5) spill.push(t.textContent ?? '');
    }
    // table cells of a row do not run into each other
    const crowded: string[] = [];
    for (const row of document.querySelectorAll('g.row')) {
      const cells = [...row.querySelectorAll('text')] as SVGTextElement[];
      for (let i = 0; i + 1 < cells.length; i++) {
        const a = cells[i].getBBox(), b = cells[i + 1].getBBox();
        if (a.x + a.width > b.x - 0.3) crowded.push(`${cells[i].textContent} | ${cells[i + 1].textContent}`);
      }
    }
    return {
      root: svg.localName,
      parserError: document.querySelector('parsererror') !== null,
      texts: texts.length,
      embedded: document.getElementsByTagNameNS(ns, 'sheet').length,
      scripts: document.querySelectorAll('script').length,
      outside,
      spill,
      crowded,
    };
  }, EMBED_NS);

  expect(facts.root).toBe('svg');
  expect(facts.parserError).toBe(false);
  expect(facts.texts).toBeGreaterThan(60);
  expect(facts.embedded).toBe(1);
  expect(facts.scripts).toBe(0);
  expect(facts.outside).toEqual([]);
  expect(facts.spill).toEqual([]);
  expect(facts.crowded).toEqual([]);

  const shot = info.outputPath('isolation-a4.png');
  await page.screenshot({ path: shot });
  await info.attach('isolation-a4', { path: shot, contentType: 'image/png' });
  await expect(page).toHaveScreenshot('isolation-a4.png', { maxDiffPixelRatio: 0.01 });

  // printed on A4 landscape with the browser's default margins (0.4 in), it takes one sheet
  const pdf = (await page.pdf({ format: 'A4', landscape: true, margin: { top: '0.4in', bottom: '0.4in', left: '0.4in', right: '0.4in' } })).toString('latin1');
  expect(pdf.match(/\/Type\s*\/Page\b(?!s)/g)).toHaveLength(1);
});
