import { beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { bundleCli, root } from '../cli/bundle';
import { svgToSheet, xmlProblem } from '../../src/export';
import { parseSheetText } from '../../src/model';
import { tableRows, texts } from './svgText';

/**
 * `svg FILE` through the command line as a script would call it: the example
 * sheets render (exit 0, an SVG document on standard output); a broken or
 * refused file exits 1 with one line on standard error, as `solve` does
 * (graph-model contract, "Refusals").
 */

const sheets = join(root, 'examples', 'sheets');
let dir = '';
let cli = '';

function run(args: string[], env: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', env: { ...process.env, ...env } });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

let counter = 0;
function fileWith(content: string): string {
  const p = join(dir, `s${counter++}.json`);
  writeFileSync(p, content);
  return p;
}

beforeAll(async () => {
  ({ dir, cli } = await bundleCli('coilwright-svg-cli-'));
});

describe('coilwright svg', () => {
  const files = readdirSync(sheets).filter((f) => f.endsWith('.json'));

  it('has the example sheets as files', () => {
    expect(files.sort()).toEqual(['control-transformer-per-unit.json', 'current-transformer-burden-opens.json', 'current-transformer-burden.json', 'distribution-transformer-25kva.json', 'isolation-transformer-230v.json', 'transformer-switch-in-230v.json', 'wireless-charging-85khz.json', 'wireless-square-drive-85khz.json']);
  });

  for (const f of files) {
    it(`renders examples/sheets/${f}`, () => {
      const r = run(['svg', join(sheets, f)], { SOURCE_DATE_EPOCH: '1764547200' });
      expect(r.stderr).toBe('');
      expect(r.status).toBe(0);
      expect(r.stdout.startsWith('<?xml')).toBe(true);
      expect(xmlProblem(r.stdout)).toBeNull();
      // the sheet inside is the file's sheet
      expect(svgToSheet(r.stdout)).toEqual(parseSheetText(readFileSync(join(sheets, f), 'utf8')));
      // SOURCE_DATE_EPOCH 1764547200 s is 2025-12-01 00:00 UTC (Unix time, common practice for repeatable builds)
      expect(r.stdout).toContain('>2025-12-01<');
    });
  }

  it('the table agrees with `solve` on the same file', () => {
    const file = join(sheets, 'isolation-transformer-230v.json');
    const solved = JSON.parse(run(['solve', file]).stdout);
    const rows = tableRows(run(['svg', file]).stdout);
    const r3 = solved.elements.Rload;
    const m = Math.hypot(r3.current.re, r3.current.im);
    // |I(Rload)| from solve, to the four figures the sheet prints
    expect(rows.find((r) => r.name === 'Rload')!.cells.i.startsWith(`${Number(m.toPrecision(4))} A ∠`)).toBe(true);
  });

  it('lays out a graph model file, its own ground the reference', () => {
    const file = join(root, 'examples', 'graphs', 'isolation-transformer-230v.json');
    const model = JSON.parse(readFileSync(file, 'utf8'));
    const r = run(['svg', file]);
    expect(r.status).toBe(0);
    expect(xmlProblem(r.stdout)).toBeNull();
    const names = tableRows(r.stdout).map((x) => x.name);
    // every element of the model has its row, the reference node none (it is 0 V by definition)
    for (const el of model.elements) expect(names).toContain(el.id);
    expect(names).not.toContain(model.ground);
    // the floating secondary is measured from its own reference, and the sheet says so
    expect(texts(r.stdout).join(' ')).toContain(`node voltages from each section's own reference node (${model.ground} where joined to it; an isolated section's reference: see the notes);`);
  });

  it('refuses a file that is not JSON: exit 1, one line, nothing on standard output', () => {
    const r = run(['svg', fileWith('{ "schema": "coilwright.sheet/3", ')]);
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/not a JSON file/);
  });

  it('refuses a damaged sheet naming the field', () => {
    const s = JSON.parse(readFileSync(join(sheets, 'isolation-transformer-230v.json'), 'utf8'));
    s.parts[1].x = 'left';
    const r = run(['svg', fileWith(JSON.stringify(s))]);
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/parts\[1\]\.x/);
  });

  it('refuses a sheet whose model is refused, naming the element, as solve does', () => {
    const s = JSON.parse(readFileSync(join(sheets, 'isolation-transformer-230v.json'), 'utf8'));
    s.parts.find((p: { ref: string }) => p.ref === 'Rload').value = 0;
    const file = fileWith(JSON.stringify(s));
    const svg = run(['svg', file]);
    const solve = run(['solve', file]);
    expect(svg.status).toBe(1);
    expect(svg.stdout).toBe('');
    expect(svg.stderr).toMatch(/"Rload".*ohms must be greater than 0/); // zero resistance is refused (contract)
    expect(svg.stderr).toBe(solve.stderr);
  });
});
