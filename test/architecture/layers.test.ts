/**
 * The layer table of DEVELOPERS.md ("Where things live") is the data of this
 * test: every import in src/ (static, re-export or dynamic) must run along an
 * edge the table allows. A room may use its own sub-rooms; a sub-room may use
 * its parent only when its row names it. "X types" allows type-only imports
 * from X. Files outside every row (the boot file) may import anything.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(__dirname, '../..');

interface Room { dir: string; may: Set<string>; types: Set<string>; anything: boolean }

/** The rows of the table whose first cell is a folder or file under src/. */
export function layerTable(markdown: string): Room[] {
  const section = markdown.split(/^## Where things live$/m)[1]?.split(/^## /m)[0] ?? '';
  const rooms: Room[] = [];
  for (const line of section.split('\n')) {
    const cells = line.split('|').map((c) => c.trim());
    const m = /^`(src\/[^`]+)`$/.exec(cells[1] ?? '');
    if (!m) continue;
    const mayText = cells[3] ?? '';
    const may = new Set<string>();
    const types = new Set<string>();
    let anything = false;
    for (const part of mayText.split(',').map((s) => s.trim()).filter(Boolean)) {
      if (/^nothing/.test(part)) continue;
      if (part === 'anything') anything = true;
      else if (/ types$/.test(part)) types.add(part.replace(/ types$/, ''));
      else may.add(part);
    }
    rooms.push({ dir: m[1].replace(/\/$/, ''), may, types, anything });
  }
  return rooms;
}

/** The room a file belongs to: the longest row that holds it. */
function roomOf(rooms: Room[], file: string): Room | null {
  let best: Room | null = null;
  for (const r of rooms) {
    if ((file === r.dir || file.startsWith(`${r.dir}/`)) && (!best || r.dir.length > best.dir.length)) best = r;
  }
  return best;
}

/** A short room name as the table writes it ("solver", "ui") → its folder. */
const folderOf = (name: string) => `src/${name}`;

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sourceFiles(p));
    else if (/\.(ts|tsx)$/.test(name) && !name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

interface Edge { from: string; to: string; typeOnly: boolean; line: number }

/** Imports of one file that point into src/, with whether each carries types only. */
export function importsOf(file: string, text: string): Edge[] {
  const edges: Edge[] = [];
  const re = /(?:^|[^\w.])(import|export)\s+(type\s+)?([^'";]*?)\s*from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;
  const lineAt = (i: number) => text.slice(0, i).split('\n').length;
  for (const m of text.matchAll(re)) {
    const spec = m[4] ?? m[5];
    if (!spec.startsWith('.')) continue;
    const clause = m[3] ?? '';
    const allTyped = !!m[2] || (/^\{[^}]*\}$/.test(clause.trim()) && clause.replace(/[{}\s]/g, '').split(',').filter(Boolean).every((s) => s.startsWith('type')));
    const to = relative(ROOT, resolve(dirname(file), spec)).replace(/\\/g, '/');
    if (!to.startsWith('src/')) continue; // package.json and the like are no room
    edges.push({ from: relative(ROOT, file).replace(/\\/g, '/'), to, typeOnly: m[5] ? false : allTyped, line: lineAt((m.index ?? 0) + m[0].search(/import|export/)) });
  }
  return edges;
}

function allowed(rooms: Room[], e: Edge): boolean {
  const a = roomOf(rooms, e.from);
  const b = roomOf(rooms, e.to);
  if (!a || a.anything) return true;
  if (!b) return false;
  if (a === b) return true;
  // a room uses its own sub-rooms
  if (b.dir.startsWith(`${a.dir}/`)) return true;
  const names = (set: Set<string>) => [...set].map(folderOf);
  const reaches = (dirs: string[]) => dirs.some((d) => b.dir === d || b.dir.startsWith(`${d}/`) || (a.dir.startsWith(`${b.dir}/`) && d === b.dir));
  if (reaches(names(a.may))) return true;
  return e.typeOnly && reaches(names(a.types));
}

describe('the layer table of DEVELOPERS.md', () => {
  const rooms = layerTable(readFileSync(join(ROOT, 'DEVELOPERS.md'), 'utf8'));

  it('is read: every folder of src/ with code has a row', () => {
    expect(rooms.length).toBeGreaterThan(8);
    const dirs = new Set(sourceFiles(join(ROOT, 'src')).map((f) => relative(ROOT, dirname(f)).replace(/\\/g, '/')));
    for (const d of dirs) if (d !== 'src') expect(roomOf(rooms, `${d}/x.ts`), `${d} has no row in the table`).not.toBeNull();
  });

  it('allows every import in src/', () => {
    const bad: string[] = [];
    for (const f of sourceFiles(join(ROOT, 'src'))) {
      for (const e of importsOf(f, readFileSync(f, 'utf8'))) {
        if (!allowed(rooms, e)) bad.push(`${e.from}:${e.line} imports ${e.to}${e.typeOnly ? ' (types)' : ''}`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('catches an import against the table (the check itself)', () => {
    // a canvas file reaching into the tools, and the editor reaching into the solver, are both outside the table
    const canvas = importsOf(join(ROOT, 'src/canvas/x.ts'), "import { ToolController } from '../tools/controller';");
    const ui = importsOf(join(ROOT, 'src/ui/x.ts'), "const m = await import('../solver');");
    const typesOnly = importsOf(join(ROOT, 'src/export/x.ts'), "import type { SolveResult } from '../solver/session';");
    expect(canvas.map((e) => allowed(rooms, e))).toEqual([false]);
    expect(ui.map((e) => allowed(rooms, e))).toEqual([false]);
    expect(typesOnly.map((e) => allowed(rooms, e))).toEqual([true]);
  });
});
