import { describe, expect, it } from 'vitest';
import { COMMANDS, chordOf, findCommand, keyLabel } from '../../src/tools/commands';
import { isolationTransformerSheet } from '../../src/model/examples/isolation';
import { nudgeSelection, selectNext } from '../../src/store/actions';
import { createEditorStore } from '../../src/store/createEditorStore';
import { ToolController } from '../../src/tools/controller';
import { key } from './helpers';

describe('commands as data', () => {
  it('every command has a key, a label and a hint, and no key is claimed twice', () => {
    const seen = new Map<string, string>();
    for (const c of COMMANDS) {
      expect(c.keys.length).toBeGreaterThan(0);
      expect(c.label).not.toBe('');
      expect(c.hint).not.toBe('');
      for (const k of c.keys) {
        expect(seen.get(k), `${k} of ${c.id}`).toBeUndefined();
        seen.set(k, c.id);
      }
    }
  });

  it('maps key events to chords the way the keyboard handler sees them', () => {
    expect(chordOf(key('Z', { mod: true, shift: true }))).toBe('mod+shift+z');
    expect(chordOf(key('ArrowLeft', { shift: true }))).toBe('shift+arrowleft');
    expect(chordOf(key('+', { shift: true }))).toBe('+');
    expect(findCommand(key('c'))?.id).toBe('link'); // C couples the selected windings
    expect(findCommand(key('/'))?.id).toBe('command-list');
    expect(findCommand(key('.'))?.id).toBe('turn');
    expect(findCommand(key('Delete'))?.id).toBe('remove');
    expect(keyLabel('mod+shift+z')).toBe('Ctrl+Shift+Z');
    expect(keyLabel('+')).toBe('+');
  });
});

describe('keyboard-only editing', () => {
  it('steps through parts, nudges the selection and drops a part with Enter', () => {
    const store = createEditorStore(isolationTransformerSheet(), 'sheet:k');
    store.setState({ view: { x: 0, y: 0, zoom: 1 } });
    const parts = store.getState().sheet.parts;
    selectNext(store, 1, false);
    expect(store.getState().selection).toEqual([parts[0].id]);
    selectNext(store, 1, true);
    expect(store.getState().selection).toEqual([parts[0].id, parts[1].id]);
    selectNext(store, -1, false);
    expect(store.getState().selection).toEqual([parts[0].id]);
    nudgeSelection(store, 1, 0);
    expect(store.getState().sheet.parts[0].x).toBe(parts[0].x + 10); // one 10-unit grid step
    const tools = new ToolController(store);
    tools.place.viewport = () => ({ width: 400, height: 300 });
    tools.startPlacing('capacitor');
    expect(tools.key(key('Enter'))).toBe(true);
    const dropped = store.getState().sheet.parts.at(-1)!;
    expect([dropped.ref, dropped.x, dropped.y]).toEqual(['C1', 200, 150]); // the middle of a 400 × 300 view, where it is free
  });
});
