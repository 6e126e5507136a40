/** An entry field that commits on Enter or leaving it; a refused entry shows its reason and the last good value stays. */
import { useEffect, useId, useState } from 'react';
import { parseEntry } from './valueEntry';

interface Props {
  label: string;
  value: string;
  unit?: string;
  /** returns a reason to refuse, or null after applying */
  apply: (text: string) => Promise<string | null> | string | null;
  hint?: string;
  testId?: string;
}

export function Field({ label, value, unit, apply, hint, testId }: Props) {
  const [text, setText] = useState(value);
  const [error, setError] = useState<string | null>(null);
  const id = useId();
  useEffect(() => {
    setText(value);
    setError(null);
  }, [value]);
  const commit = async () => {
    if (text === value) return setError(null);
    const reason = await apply(text);
    setError(reason);
  };
  return (
    <div className={`field ${error ? 'field-bad' : ''}`}>
      <label htmlFor={id}>{label}</label>
      <div className="field-row">
        <input
          id={id}
          value={text}
          data-testid={testId}
          aria-invalid={!!error}
          aria-describedby={error ? `${id}-err` : hint ? `${id}-hint` : undefined}
          onChange={(e) => setText(e.target.value)}
          onBlur={commit}
          onKeyDown={(e) => {
            if (e.key === 'Enter') void commit();
            if (e.key === 'Escape') { setText(value); setError(null); }
            e.stopPropagation();
          }}
        />
        {unit && <span className="unit">{unit}</span>}
      </div>
      {error ? (
        <div id={`${id}-err`} className="field-error" role="alert">{error} — still {value}{unit ? ` ${unit}` : ''}</div>
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
