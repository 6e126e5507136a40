/**
 * An entry field. A live field solves each valid entry as it is typed (after
 * a short pause): the field is marked pending while the text is not yet in
 * the sheet, and invalid, with the reason, while it cannot be read; the last
 * good value stays in the sheet. Enter or leaving the field applies at once;
 * Escape puts back the value the field had. All the values typed into a field
 * in one go are one undo step.
 */
import { useEffect, useId, useRef, useState } from 'react';
import { parseEntry } from './valueEntry';
import { useEditor } from './editorContext';

interface Props {
  label: string;
  value: string;
  unit?: string;
  /** returns a reason to refuse, or null after applying */
  apply: (text: string) => Promise<string | null> | string | null;
  hint?: string;
  testId?: string;
  /** solve while typing (for values) */
  live?: boolean;
}

/** how long typing must pause before a live entry is solved */
export const LIVE_DELAY_MS = 250;

export function Field({ label, value, unit, apply, hint, testId, live }: Props) {
  const { store } = useEditor();
  const [text, setText] = useState(value);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const id = useId();
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  /** the field's value when typing began, and whether this round of typing has made its undo step yet */
  const round = useRef<{ start: string; stepped: boolean } | null>(null);
  const applied = useRef<string | null>(null);
  useEffect(() => {
    // a value that came back from our own live entry leaves the text being typed alone
    if (round.current && applied.current !== null) return;
    setText(value);
    setError(null);
    setPending(false);
  }, [value]);
  useEffect(() => () => { if (timer.current) clearTimeout(timer.current); }, []);

  const run = async (t: string, final: boolean) => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    const r = round.current;
    if (t === (r ? r.start : value) && !r?.stepped) {
      setError(null);
      setPending(false);
      if (final) round.current = null;
      return;
    }
    // later entries of one round of typing replace the first without another undo step
    const quiet = !!r?.stepped;
    if (quiet) store.temporal.getState().pause();
    let reason: string | null;
    try {
      applied.current = t;
      reason = await apply(t);
    } finally {
      if (quiet) store.temporal.getState().resume();
    }
    if (!reason && r) r.stepped = true;
    if (reason) applied.current = null;
    setError(reason);
    setPending(false);
    if (final) {
      round.current = null;
      applied.current = null;
    }
  };

  const onType = (t: string) => {
    setText(t);
    if (!round.current) round.current = { start: value, stepped: false };
    if (!live) return;
    setPending(true);
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void run(t, false), LIVE_DELAY_MS);
  };

  const state = error ? 'invalid' : pending ? 'pending' : 'ok';
  return (
    <div className={`field ${error ? 'field-bad' : ''} ${pending ? 'field-pending' : ''}`} data-state={state}>
      <label htmlFor={id}>{label}</label>
      <div className="field-row">
        <input
          id={id}
          value={text}
          data-testid={testId}
          data-state={state}
          aria-invalid={!!error}
          aria-describedby={error ? `${id}-err` : hint ? `${id}-hint` : undefined}
          onChange={(e) => onType(e.target.value)}
          onBlur={() => void run(text, true)}
          onKeyDown={(e) => {
            if (e.key === 'Enter') void run(text, true);
            if (e.key === 'Escape') {
              const start = round.current?.start ?? value;
              if (timer.current) clearTimeout(timer.current);
              setText(start);
              setError(null);
              setPending(false);
              if (round.current?.stepped) void run(start, true);
              else round.current = null;
            }
            e.stopPropagation();
          }}
        />
        {unit && <span className="unit">{unit}</span>}
        {pending && <span className="field-mark" aria-label="not solved yet" title="Solved when you pause typing">…</span>}
      </div>
      {error ? (
        <div id={`${id}-err`} className="field-error" role="alert">{error} — still {round.current?.start ?? value}{unit ? ` ${unit}` : ''}</div>
      ) : hint ? (
        <div id={`${id}-hint`} className="field-hint">{hint}</div>
      ) : null}
    </div>
  );
}

/** Parse a quantity and check it; returns the number or a reason. */
export async function quantity(text: string, unit: string, check?: (v: number) => string | null): Promise<{ value: number } | { reason: string }> {
  const r = await parseEntry(text, unit);
  if (!r.ok) return { reason: r.reason };
  const bad = check?.(r.value);
  return bad ? { reason: bad } : { value: r.value };
}
