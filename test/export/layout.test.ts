import { describe, expect, it } from 'vitest';
import { EXAMPLES, deriveCircuit, pinPositions, seedIds } from '../../src/model';
import { currentWeight, declutterTags, overlayLayout, phasorText, tagBox, type TextMeasure } from '../../src/model/drawLayout';
import { solveGraph } from '../../src/solver';

/** The shared overlay layout (model/drawLayout) that the export draws from. */

const measure: TextMeasure = { tag: (s) => s.length * 6.02, label: (s, size, bold) => s.length * size * (bold ? 0.63 : 0.58) };

function isolation() {
  seedIds(3);
  const sheet = EXAMPLES.find((e) => e.key === 'isolation')!.make();
  const circuit = deriveCircuit(sheet);
  const result = solveGraph(circuit.model);
  return { sheet, circuit, result };
}

describe('overlayLayout', () => {
  it('puts an arrow beside each part along its reference direction, from pin 0 to pin 1 (contract)', () => {
    const { sheet, circuit, result } = isolation();
    const layout = overlayLayout(sheet, circuit, result, { noWireFlows: true });
    // seven parts carry current; none is left out
    expect(layout.arrows).toHaveLength(7);
    const r1 = sheet.parts.find((p) => p.ref === 'Rp')!;
    const [a, b] = pinPositions(r1);
    const arrow = layout.arrows.find((x) => Math.abs((x.from.x + x.to.x) / 2 - (a.x + b.x) / 2) < 1 && x.from.y > a.y)!;
    expect(Math.sign(arrow.to.x - arrow.from.x)).toBe(Math.sign(b.x - a.x));
  });

  it('draws larger currents heavier: width 1 + 2.6·sqrt(|I|/|I|max)', () => {
    expect(currentWeight(4, 4)).toBeCloseTo(3.6, 12); // the largest current
    expect(currentWeight(1, 4)).toBeCloseTo(2.3, 12); // a quarter of it: sqrt(1/4) = 0.5
    expect(currentWeight(0, 4)).toBe(1);
  });

  it('tags every node but the reference, and the wire currents by Kirchhoff', () => {
    const { sheet, circuit, result } = isolation();
    const layout = overlayLayout(sheet, circuit, result);
    const voltages = layout.tags.filter((t) => t.kind === 'voltage').map((t) => t.text.split(':')[0]);
    expect(voltages.sort()).toEqual(Object.keys(result.nodes).filter((n) => n !== 'gnd').sort());
    expect(layout.arrows.length).toBeGreaterThan(7);
  });

  it('at an instant of a time response each arrow turns with the sign of its current, scaled by the run\'s largest current', () => {
    const { sheet, circuit, result } = isolation();
    // the same circuit at two instants: every current +1 A, then every current −0.25 A (real values, im 0)
    const at = (amps: number) => {
      const r = structuredClone(result);
      for (const id in r.elements) {
        const e = r.elements[id];
        if ('current' in e) e.current = { re: amps, im: 0 };
        else e.currents = [{ re: amps, im: 0 }, { re: amps, im: 0 }];
      }
      for (const n in r.nodes) r.nodes[n] = { re: -3, im: 0 };
      return overlayLayout(sheet, circuit, r, { noWireFlows: true, instant: { maxAmps: 2 } });
    };
    const pos = at(1);
    const neg = at(-0.25);
    const rp = (l: typeof pos) => l.arrows.find((a) => a.element === 'Rp')!;
    const part = sheet.parts.find((p) => p.ref === 'Rp')!;
    const [a, b] = pinPositions(part);
    // positive: along the reference (pin 0 → pin 1); negative: against it (graph-model reference directions)
    expect(Math.sign(rp(pos).to.x - rp(pos).from.x)).toBe(Math.sign(b.x - a.x));
    expect(Math.sign(rp(neg).to.x - rp(neg).from.x)).toBe(-Math.sign(b.x - a.x));
    // widths from the run's largest current, 2 A: 1 + 2.6·√(1/2) and 1 + 2.6·√(0.25/2)
    expect(rp(pos).width).toBeCloseTo(1 + 2.6 * Math.sqrt(0.5), 12);
    expect(rp(neg).width).toBeCloseTo(1 + 2.6 * Math.sqrt(0.125), 12);
    // tags: a current by its size (the arrow gives the sense), a node voltage with its sign
    expect(neg.tags.some((t) => t.kind === 'current' && t.text === '250 mA')).toBe(true);
    expect(neg.tags.filter((t) => t.kind === 'voltage').every((t) => t.text.endsWith(': -3 V'))).toBe(true);
  });

  it('phasorText: magnitude with an SI prefix and the angle in degrees', () => {
    expect(phasorText({ re: 0, im: -0.002 }, 'A')).toBe('2 mA ∠-90.0°'); // -j·2 mA lies at -90°
    expect(phasorText({ re: -230, im: 0 }, 'V')).toBe('230 V ∠180.0°'); // one angle range, (-180°, 180°]
    expect(phasorText({ re: 0, im: 0 }, 'V')).toBe('0 V');
  });
});

describe('declutterTags', () => {
  it('leaves no two reading tags of the example sheets on top of each other', () => {
    for (const ex of EXAMPLES) {
      seedIds(3);
      const sheet = ex.make();
      const circuit = deriveCircuit(sheet);
      const layout = declutterTags(sheet, overlayLayout(sheet, circuit, solveGraph(circuit.model)), measure);
      const boxes = layout.tags.map((t) => tagBox(t, measure));
      for (let i = 0; i < boxes.length; i++) {
        for (let j = i + 1; j < boxes.length; j++) {
          const a = boxes[i], b = boxes[j];
          const overlapX = Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0);
          const overlapY = Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0);
          expect(overlapX > 0 && overlapY > 0, `${ex.key}: "${layout.tags[i].text}" and "${layout.tags[j].text}"`).toBe(false);
        }
      }
    }
  });

  it('keeps the arrows and the tag texts, and does not touch its input', () => {
    const { sheet, circuit, result } = isolation();
    const before = overlayLayout(sheet, circuit, result);
    const copy = JSON.stringify(before);
    const after = declutterTags(sheet, before, measure);
    expect(JSON.stringify(before)).toBe(copy);
    expect(after.arrows).toBe(before.arrows);
    expect(after.tags.map((t) => t.text)).toEqual(before.tags.map((t) => t.text));
  });
});
