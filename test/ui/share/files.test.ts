import { describe, expect, it } from 'vitest';
import { EXAMPLES, seedIds, sheetToGraph } from '../../../src/model';
import { sheetToSvg } from '../../../src/export';
import { solveGraph } from '../../../src/solver';
import { readSheetFile, sheetFileName } from '../../../src/ui/files';
import { MAX_FILE_BYTES, fileProblem } from '../../../src/ui/share/importGuard';

const HOSTILE = '<script>alert(1)</script> & "q" ]]>';

describe('sheet → file → sheet', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.key}: the saved file (JSON) and the SVG sheet read back identical`, async () => {
      seedIds(41);
      const sheet = ex.make();
      sheet.title = `${ex.key} ${HOSTILE}`;
      // the file as "Save file" writes it (downloadSheet: JSON.stringify(sheet, null, 2))
      const back = await readSheetFile({ text: JSON.stringify(sheet, null, 2), name: sheetFileName(sheet) });
      expect(back).toEqual(sheet); // identity
      const svg = sheetToSvg(sheet, solveGraph(sheetToGraph(sheet)), { date: '2026-12-01', version: '0.1.0' });
      expect(await readSheetFile({ text: svg, name: 'x.svg' })).toEqual(sheet); // identity through the embedded sheet
    });
  }

  it('the file name keeps only safe characters of a hostile title', () => {
    seedIds(42);
    const sheet = EXAMPLES[0].make();
    sheet.title = HOSTILE;
    expect(sheetFileName(sheet)).toBe('script-alert-1-script-q.coilwright.json');
  });
});

describe('files that are refused, naming what is wrong', () => {
  it('truncated, foreign, newer, graph-less and SVG without a sheet', async () => {
    seedIds(43);
    const text = JSON.stringify(EXAMPLES[0].make());
    await expect(readSheetFile({ text: text.slice(0, text.length >> 1), name: 'cut.json' })).rejects.toThrow('cut.json is not a Coilwright file: it is not valid JSON');
    await expect(readSheetFile({ text: '{"format":"other"}', name: 'f.json' })).rejects.toThrow('no "schema" field');
    await expect(readSheetFile({ text: '{"schema":"coilwright.sheet/99","parts":[]}', name: 'n.json' })).rejects.toThrow('Sheet version 99 is newer than this editor reads');
    await expect(readSheetFile({ text: '<svg xmlns="http://www.w3.org/2000/svg"></svg>', name: 'p.svg' })).rejects.toThrow('carries no Coilwright sheet');
    const svg = sheetToSvg(EXAMPLES[0].make(), null, { date: '2026-12-01' });
    await expect(readSheetFile({ text: svg.slice(0, svg.indexOf('</coilwright:sheet>') - 10), name: 'cut.svg' })).rejects.toThrow('cut short');
  });

  it('an empty or oversized file is refused before it is read', () => {
    expect(fileProblem({ name: 'a.json', size: 0 })).toBe('a.json is empty');
    expect(fileProblem({ name: 'big.json', size: MAX_FILE_BYTES + 1 })).toBe('big.json is too large to be a sheet (5 MB; a sheet file is at most 5 MB)');
    expect(fileProblem({ name: 'huge.svg', size: 80 * 1024 * 1024 })).toBe('huge.svg is too large to be a sheet (80 MB; a sheet file is at most 5 MB)');
    expect(fileProblem({ name: 'ok.json', size: 40_000 })).toBeNull();
  });
});
