/**
 * Rounding noise shown as what it is: zero. A value (or the real or imaginary
 * part of one) smaller than a relative floor of the largest of its kind on
 * the sheet (voltages, currents, powers) is solver rounding, not a reading:
 * a current of 6.661 fA next to amperes, or -799.4 fvar with an open primary.
 * The unrounded result is kept for the CSV files, which carry the numbers
 * exactly as the command line prints them.
 */
import type { ComplexJson, ElementResult, PowerJson, SolveResult } from './graph';
import { mag } from './phasor';
import { nameTable } from './names';

/** the floor, relative to the largest value of the same kind (double precision leaves about 1e-16; ill-conditioned sheets more) */
export const RELATIVE_FLOOR = 1e-10;

const isTwo = (r: ElementResult): r is Extract<ElementResult, { current: ComplexJson }> => 'current' in r;

function floorOf(values: Iterable<number>): number {
  let top = 0;
  for (const v of values) if (v > top) top = v;
  return top * RELATIVE_FLOOR;
}

function cut(z: ComplexJson, floor: number): ComplexJson {
  const re = Math.abs(z.re) < floor ? 0 : z.re;
  const im = Math.abs(z.im) < floor ? 0 : z.im;
  return re === z.re && im === z.im ? z : { re, im };
}

function cutPower(p: PowerJson, floor: number): PowerJson {
  const watts = Math.abs(p.watts) < floor ? 0 : p.watts;
  const vars = Math.abs(p.vars) < floor ? 0 : p.vars;
  return watts === p.watts && vars === p.vars ? p : { watts, vars };
}

export function floorResult(result: SolveResult): SolveResult {
  const els = Object.values(result.elements);
  const vFloor = floorOf([
    ...Object.values(result.nodes).map(mag),
    ...els.flatMap((r) => (isTwo(r) ? [mag(r.voltage)] : r.voltages.map(mag))),
  ]);
  const iFloor = floorOf(els.flatMap((r) => (isTwo(r) ? [mag(r.current)] : r.currents.map(mag))));
  const sFloor = floorOf(els.map((r) => Math.hypot(r.power.watts, r.power.vars)));
  // name tables: a node or part named "__proto__" is an entry like any other
  const nodes = nameTable<ComplexJson>();
  for (const [n, v] of Object.entries(result.nodes)) nodes[n] = cut(v, vFloor);
  const elements = nameTable<ElementResult>();
  for (const [id, r] of Object.entries(result.elements)) {
    elements[id] = isTwo(r)
      ? { voltage: cut(r.voltage, vFloor), current: cut(r.current, iFloor), power: cutPower(r.power, sFloor) }
      : {
          voltages: [cut(r.voltages[0], vFloor), cut(r.voltages[1], vFloor)],
          currents: [cut(r.currents[0], iFloor), cut(r.currents[1], iFloor)],
          power: cutPower(r.power, sFloor),
        };
  }
  return { ...result, nodes, elements };
}
