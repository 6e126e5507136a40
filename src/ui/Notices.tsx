/**
 * Refusals, hazards, notes and short messages, under the drawing, in one
 * compact strip: hazards first and in their own colour, each pointing at its
 * part ("Show" selects it); a refusal in one line; the routine notes counted,
 * in full on demand. The strip never takes more than a few lines from the
 * drawing; expanded, its list scrolls.
 */
import { useMemo, useState } from 'react';
import { cautionsFor, openSecondaries, overloads, type Caution } from '../model/cautions';
import type { DerivedCircuit } from '../model/toGraph';
import type { EditorState } from '../store/types';
import { useEditor, useEditorState } from './editorContext';

export interface NoticeItem {
  tone: 'hazard' | 'error' | 'info' | 'message';
  head: string;
  text: string;
  /** the sheet part it is about */
  partId?: string;
  testId?: string;
}

/** The isolated-section warning of the solve, said of the sheet. */
export function isolatedText(w: string): string {
  return w.replace(/^isolated part:\s*/i, '');
}

function partOf(circuit: DerivedCircuit | null, c: Caution): string | undefined {
  if (!circuit || !c.target) return undefined;
  if (c.target.kind === 'element') return circuit.partOfElement.get(c.target.id);
  // a node: a part with a pin on it
  const i = circuit.topology.pinNodes.findIndex((nodes) => nodes.includes(c.target!.id));
  return i >= 0 ? circuit.source.parts[i]?.id : undefined;
}

/** Every notice of the editor's state, hazards first. */
export function noticesOf(s: Pick<EditorState, 'solve' | 'derived' | 'notice'>): NoticeItem[] {
  const { solve } = s;
  const out: NoticeItem[] = [];
  const circuit = s.derived ?? solve.circuit;
  const hazards: Caution[] = [];
  if (circuit) hazards.push(...openSecondaries(circuit.model));
  if (solve.status === 'solved' && solve.result && solve.circuit) {
    for (const c of cautionsFor(solve.circuit.model, solve.result)) hazards.push(c);
    for (const c of overloads(solve.circuit, solve.result)) hazards.push(c);
  }
  // the most specific first: an open secondary, then an open winding, then a hazardous voltage
  const rank = { 'open-secondary': 0, 'open-winding': 1, overload: 2, elv: 3 } as Record<string, number>;
  hazards.sort((a, b) => (rank[a.kind] ?? 3) - (rank[b.kind] ?? 3));
  for (const c of hazards) {
    out.push({
      tone: 'hazard', head: c.kind === 'elv' ? 'Hazardous voltage' : c.kind === 'open-secondary' ? 'Open current-transformer secondary' : c.kind === 'overload' ? 'Above rating' : 'Open winding',
      text: c.text, partId: partOf(c.kind === 'elv' ? solve.circuit : circuit, c), testId: `caution-${c.kind}`,
    });
  }
  if (solve.status === 'refused' && solve.refusal) {
    out.push({ tone: 'error', head: 'Not solved', text: `${solve.refusal.message}${solve.result ? ' (the last good values are shown in grey)' : ''}`, testId: 'refusal' });
  }
  if (s.notice) out.push({ tone: s.notice.tone === 'error' ? 'error' : 'message', head: s.notice.tone === 'error' ? 'Could not' : 'Done', text: s.notice.text, testId: 'message' });
  for (const n of s.derived?.notes ?? []) out.push({ tone: 'info', head: 'Note', text: n });
  if (solve.status !== 'refused') for (const w of solve.result?.warnings ?? []) out.push({ tone: 'info', head: 'Isolated section', text: isolatedText(w), testId: 'warning' });
  return out;
}

export function Notices() {
  const { store } = useEditor();
  const solve = useEditorState((s) => s.solve);
  const derived = useEditorState((s) => s.derived);
  const notice = useEditorState((s) => s.notice);
  const [open, setOpen] = useState(false);
  const items = useMemo(() => noticesOf({ solve, derived, notice }), [solve, derived, notice]);
  if (!items.length) return null;
  const hazards = items.filter((i) => i.tone === 'hazard');
  const errors = items.filter((i) => i.tone === 'error');
  const infos = items.filter((i) => i.tone === 'info');
  const messages = items.filter((i) => i.tone === 'message');
  const lead = [...hazards, ...errors, ...messages];
  const show = (id?: string) => id && store.setState({ selection: [id] });
  const count = (n: number, one: string, many: string) => (n ? `${n} ${n === 1 ? one : many}` : '');
  const summary = [count(hazards.length, 'hazard', 'hazards'), count(errors.length, 'refusal', 'refusals'), count(infos.length, 'note', 'notes')].filter(Boolean).join(' · ');
  const line = (i: NoticeItem, k: number, full: boolean) => (
    <div key={k} className={`notice notice-${i.tone} ${full ? 'full' : ''}`} role={i.tone === 'hazard' || i.tone === 'error' ? 'alert' : 'status'} data-testid={i.testId}>
      {i.tone === 'hazard' && <span className="hazard-mark" aria-hidden="true">⚠</span>}
      <strong>{i.head}:</strong> <span className="notice-text">{i.text}</span>
      {i.partId && <button type="button" className="notice-btn" onClick={() => show(i.partId)} title="Select the part this is about">Show</button>}
      {i.tone === 'message' && <button type="button" className="notice-x" aria-label="Dismiss message" onClick={() => store.setState({ notice: null })}>×</button>}
    </div>
  );
  return (
    <div className={`notices ${open ? 'open' : ''}`} aria-live="polite" data-testid="notices">
      <div className="notice-strip">
        <span className="notice-counts" data-testid="notice-counts">{summary || 'Messages'}</span>
        <button type="button" className="notice-btn" aria-expanded={open} data-testid="notices-toggle" onClick={() => setOpen(!open)}>
          {open ? 'Less ▴' : `All ${items.length} ▾`}
        </button>
      </div>
      {open ? <div className="notice-list">{items.map((i, k) => line(i, k, true))}</div> : lead.slice(0, 2).map((i, k) => line(i, k, false))}
    </div>
  );
}
