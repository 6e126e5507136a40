/** The searchable list of every command (opened with "/"): type to narrow it, arrows move the mark, Enter runs it. */
import { useEffect, useMemo, useRef, useState } from 'react';
import { COMMANDS, keyLabel, type Command } from '../tools/commands';
import { useCommandHost } from './commandHost';
import { useEditor } from './editorContext';

/** Commands whose label, hint or key hold every word typed, best first (label starts, then label holds, then hint). */
export function matchCommands(query: string, list: Command[] = COMMANDS): Command[] {
  const words = query.toLowerCase().split(/\s+/).filter(Boolean);
  if (!words.length) return list;
  const scored: { c: Command; score: number }[] = [];
  for (const c of list) {
    const label = c.label.toLowerCase();
    const all = `${label} ${c.hint.toLowerCase()} ${c.keys.map(keyLabel).join(' ').toLowerCase()}`;
    if (!words.every((w) => all.includes(w))) continue;
    const score = label.startsWith(words[0]) ? 0 : words.every((w) => label.includes(w)) ? 1 : 2;
    scored.push({ c, score });
  }
  return scored.sort((a, b) => a.score - b.score).map((x) => x.c);
}

export function CommandList({ onClose }: { onClose: () => void }) {
  const host = useCommandHost();
  const { store } = useEditor();
  const [query, setQuery] = useState('');
  const [mark, setMark] = useState(0);
  const input = useRef<HTMLInputElement>(null);
  const found = useMemo(() => matchCommands(query), [query]);
  useEffect(() => input.current?.focus(), []);
  useEffect(() => setMark(0), [query]);
  const run = (c: Command | undefined) => {
    if (!c) return;
    if (c.enabled && !c.enabled(store.getState())) return;
    onClose();
    // after the list has closed, so that a command that moves the focus keeps it
    setTimeout(() => c.run(host), 0);
  };
  return (
    <div className="command-list-back" onPointerDown={(e) => e.target === e.currentTarget && onClose()}>
      <div className="command-list" role="dialog" aria-label="Find a command" aria-modal="true">
        <input
          ref={input}
          className="command-query"
          placeholder="Type to find a command…"
          aria-label="Find a command"
          aria-controls="command-found"
          aria-activedescendant={found[mark] ? `cmd-${found[mark].id}` : undefined}
          data-testid="command-query"
          value={query}
          onChange={(e) => setQuery(e.target.value)}
          onKeyDown={(e) => {
            e.stopPropagation();
            if (e.key === 'Escape') { e.preventDefault(); onClose(); }
            else if (e.key === 'ArrowDown') { e.preventDefault(); setMark((m) => Math.min(found.length - 1, m + 1)); }
            else if (e.key === 'ArrowUp') { e.preventDefault(); setMark((m) => Math.max(0, m - 1)); }
            else if (e.key === 'Enter') { e.preventDefault(); run(found[mark]); }
          }}
        />
        <ul id="command-found" role="listbox" className="command-found" aria-label="Commands found">
          {found.map((c, i) => {
            const enabled = !c.enabled || c.enabled(store.getState());
            return (
              <li key={c.id} id={`cmd-${c.id}`} role="option" aria-selected={i === mark} aria-disabled={!enabled} data-command={c.id}
                className={`${i === mark ? 'marked' : ''} ${enabled ? '' : 'unavailable'}`} onPointerDown={(e) => { e.preventDefault(); run(c); }} onPointerEnter={() => setMark(i)}>
                <span className="command-name">{c.label}</span>
                <span className="command-hint">{c.hint}</span>
                <span className="command-keys">{c.keys.map((k) => <kbd key={k}>{keyLabel(k)}</kbd>)}</span>
              </li>
            );
          })}
          {!found.length && <li className="muted">No command has those words.</li>}
        </ul>
      </div>
    </div>
  );
}
