import { describe, expect, it } from 'vitest';
import { MAX_NAME_CHARS, nameProblem, shownName, titleProblem, withNameTables } from '../../src/model/names';
import { refProblem } from '../../src/model/designators';
import { validateSheet } from '../../src/model/sheetSchema';
import { emptySheet } from '../../src/model/sheet';
import { ModelRefusal, parseGraphModel, solveGraph, sweepGraph } from '../../src/solver';
import { formatJson } from '../../src/cli/format';
import type { ComplexJson, VoltageSourceEl } from '../../src/model/graph';
import { model } from '../helpers';

/**
 * One name rule for the fields, sheet files and graph models, and result
 * tables in which any name is an entry like any other. The reserved names
 * are the properties every JavaScript object inherits (ECMA-262,
 * Object.prototype, from memory); the hidden characters are those of Unicode
 * general categories Cc, Cf, Zl and Zp (Unicode Standard, chapter 4, from memory).
 */

const RESERVED = ['__proto__', 'constructor', 'toString', 'hasOwnProperty', 'valueOf', 'isPrototypeOf', '__defineGetter__'];
const RLO = '\u202E'; // RIGHT-TO-LEFT OVERRIDE (Unicode bidirectional algorithm, UAX #9)

describe('the name rule', () => {
  it('accepts ordinary names and the reserved ones, refuses empty, long, padded and hidden characters', () => {
    for (const n of ['R1', 'n_out', 'a-b', 'V(out)', 'Ω1', 'Knoten ä', ...RESERVED]) expect(nameProblem(n), n).toBeNull();
    expect(nameProblem('')).toMatch(/empty/);
    expect(nameProblem('x'.repeat(MAX_NAME_CHARS))).toBeNull();
    expect(nameProblem('x'.repeat(MAX_NAME_CHARS + 1))).toMatch(new RegExp(`at most ${MAX_NAME_CHARS}`));
    expect(nameProblem(' a')).toMatch(/space/);
    expect(nameProblem(`ab${RLO}cd`)).toMatch(/bidirectional control \(U\+202E\)/);
    expect(nameProblem('a\u2066b')).toMatch(/bidirectional control \(U\+2066\)/); // LEFT-TO-RIGHT ISOLATE
    expect(nameProblem('a\u200Bb')).toMatch(/zero-width/);
    expect(nameProblem('a\u0000b')).toMatch(/control character \(U\+0000\)/);
    expect(nameProblem('a\nb')).toMatch(/control character \(U\+000A\)/);
    expect(nameProblem('a\u2028b')).toMatch(/line break/);
    expect(nameProblem('a\uD800b')).toMatch(/broken character/);
    expect(nameProblem('a\u{1F600}b')).toBeNull(); // a whole surrogate pair is one character
    expect(titleProblem('Bench, =1+1')).toBeNull();
    expect(titleProblem(`T${RLO}x`)).toMatch(/bidirectional/);
    expect(titleProblem('t'.repeat(201))).toMatch(/at most 200/);
  });

  it('quotes a name in a message with its hidden characters spelled out', () => {
    expect(shownName(`ab${RLO}cd`)).toBe('"ab\\u{202e}cd"');
    expect(shownName('x'.repeat(50))).toBe(`"${'x'.repeat(40)}…"`);
  });

  it('is the same in the designator field, the sheet schema and the graph reader', () => {
    const sheet = emptySheet();
    const bad = `R${RLO}1`;
    expect(refProblem(sheet, 'part:x', bad)).toMatch(/bidirectional control/);
    expect(refProblem(sheet, 'part:x', '__proto__')).toBeNull();
    expect(refProblem(sheet, 'part:x', 'gnd')).toMatch(/ground/);
    const part = { id: 'part:a', kind: 'label', x: 0, y: 0, rot: 0, mirror: false, ref: '', name: bad };
    const r = validateSheet({ ...sheet, parts: [part] });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/^parts\[0\]\.name: holds a bidirectional control \(U\+202E\)/);
    expect(validateSheet({ ...sheet, parts: [{ ...part, name: '__proto__' }] }).ok).toBe(true);
    const V: VoltageSourceEl = { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 };
    const refuse = (m: unknown) => {
      try {
        parseGraphModel(m);
      } catch (e) {
        expect(e).toBeInstanceOf(ModelRefusal);
        return (e as Error).message;
      }
      throw new Error('accepted');
    };
    expect(refuse(model(50, [{ ...V, nodes: [bad, 'gnd'] }]))).toMatch(/element "V1" \(voltage-source\): nodes\[0\] holds a bidirectional control \(U\+202E\).*got "R\\u\{202e\}1"/);
    expect(refuse(model(50, [{ ...V, id: bad }]))).toMatch(/element #1: "id" holds a bidirectional control.*got "R\\u\{202e\}1"/);
    expect(refuse(model(50, [V], [], { ground: 'g\u0007' }))).toMatch(/ground holds a control character \(U\+0007\)/);
    expect(refuse(model(50, [V], [{ id: 'K\u200B', windings: ['V1', 'V1'], k: 1 }]))).toMatch(/coupling #1: "id" holds an invisible zero-width character/);
  });
});

describe('reserved names in results', () => {
  // a divider: V1 = 10 V over R1 = 10 Ω and R2 = 30 Ω; every node and element carries a reserved name
  const divider = model(50, [
    { id: '__proto__', kind: 'voltage-source', nodes: ['constructor', 'gnd'], magnitude: 10, phaseDeg: 0 },
    { id: 'toString', kind: 'resistor', nodes: ['constructor', '__proto__'], ohms: 10 },
    { id: 'hasOwnProperty', kind: 'resistor', nodes: ['__proto__', 'gnd'], ohms: 30 },
  ]);

  it('every node and element comes out as an own entry with its value', () => {
    const r = solveGraph(parseGraphModel(divider));
    expect(Object.keys(r.nodes).sort()).toEqual(['__proto__', 'constructor', 'gnd'].sort());
    expect(Object.keys(r.elements).sort()).toEqual(['__proto__', 'hasOwnProperty', 'toString'].sort());
    // voltage divider: V(mid) = 10·30/(10 + 30) = 7.5 V (Ohm's law)
    expect(r.nodes['__proto__'].re).toBeCloseTo(7.5, 12);
    expect((r.nodes['constructor'] as unknown as ComplexJson).re).toBeCloseTo(10, 12);
    expect((r.elements.toString as unknown as { current: { re: number } }).current.re).toBeCloseTo(0.25, 12);
    const json = JSON.parse(formatJson(r));
    expect(Object.hasOwn(json.nodes, '__proto__')).toBe(true);
    expect(Object.hasOwn(json.elements, '__proto__')).toBe(true);
    expect(json.nodes.__proto__.re).toBeCloseTo(7.5, 12);
  });

  it('a sweep keeps them too, and a result that crossed a thread reads the same', () => {
    const s = sweepGraph(parseGraphModel(divider), [50, 60], ['__proto__', 'toString']);
    expect(Object.keys(s.nodes)).toEqual(['__proto__']);
    expect(Object.keys(s.elements)).toEqual(['__proto__', 'toString']); // "__proto__" names a node and an element
    expect(s.nodes['__proto__'][1].re).toBeCloseTo(7.5, 12);
    const crossed = withNameTables(structuredClone(solveGraph(parseGraphModel(divider))));
    expect(Object.getPrototypeOf(crossed.nodes)).toBeNull();
    expect(crossed.nodes['__proto__'].re).toBeCloseTo(7.5, 12);
    // a name that is missing reads as missing, not as an inherited function
    expect(crossed.nodes.valueOf).toBeUndefined();
  });
});
