/** The top bar: sheet menu (sheets, examples, files), history and view commands, the sheet title. */
import { useEffect, useRef, useState } from 'react';

/** Open state of a pop-over that closes on a click elsewhere or on Escape. */
function usePopover() {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    const away = (e: PointerEvent) => { if (!ref.current?.contains(e.target as Node)) setOpen(false); };
    const esc = (e: KeyboardEvent) => { if (e.key === 'Escape') setOpen(false); };
    window.addEventListener('pointerdown', away);
    window.addEventListener('keydown', esc);
    return () => {
      window.removeEventListener('pointerdown', away);
      window.removeEventListener('keydown', esc);
    };
  }, [open]);
  return { open, setOpen, ref };
}
import { EXAMPLES } from '../model/examples';
import { COMMANDS, keyLabel } from '../tools/commands';
import { CommandButton } from './CommandButton';
import { useCommandHost } from './commandHost';
import { useEditorState } from './editorContext';
import type { SheetEntry } from '../store/types';
import { SharePanel } from './share/SharePanel';

/** A kept sheet in the list: open it, rename it (in place), forget it. */
function KeptRow({ entry, current, onOpen, onForget, onRename }: { entry: SheetEntry; current: boolean; onOpen: () => void; onForget: () => void; onRename?: (title: string) => Promise<string | null> }) {
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState(entry.title);
  const [problem, setProblem] = useState<string | null>(null);
  const done = async () => {
    const why = await onRename?.(text);
    if (why) return setProblem(why);
    setProblem(null);
    setEditing(false);
  };
  if (editing) {
    return (
      <div className="menu-row menu-rename">
        <input
          autoFocus aria-label={`New title for ${entry.title}`} data-testid="rename-input" value={text} aria-invalid={!!problem}
          onChange={(e) => { setText(e.target.value); setProblem(null); }}
          onKeyDown={(e) => {
            e.stopPropagation();
            if (e.key === 'Enter') void done();
            if (e.key === 'Escape') { setEditing(false); setProblem(null); setText(entry.title); }
          }}
        />
        <button className="menu-x" aria-label="Keep this title" title="Keep this title (Enter)" onClick={() => void done()}>✓</button>
        {problem && <div className="field-error" role="alert">{problem}</div>}
      </div>
    );
  }
  return (
    <div className="menu-row" data-testid="kept-sheet" data-id={entry.id}>
      <button role="menuitem" className="menu-item" aria-current={current} onClick={onOpen}>
        {current ? '● ' : ''}{entry.title || 'Untitled'} <small>{new Date(entry.updated).toLocaleString()}</small>
      </button>
      {onRename && <button className="menu-x" aria-label={`Rename ${entry.title}`} title="Rename this sheet" onClick={() => { setText(entry.title); setEditing(true); }}>✎</button>}
      {!current && <button className="menu-x" aria-label={`Forget ${entry.title}`} title="Forget this sheet" onClick={onForget}>×</button>}
    </div>
  );
}

export function TopBar({ onExample, onSwitch, onForget, onRename }: { onExample: (key: string) => void; onSwitch: (id: string) => void; onForget: (id: string) => void; onRename?: (id: string, title: string) => Promise<string | null> }) {
  const { open, setOpen, ref } = usePopover();
  const title = useEditorState((s) => s.sheet.title);
  const library = useEditorState((s) => s.library);
  const sheetId = useEditorState((s) => s.sheetId);
  const host = useCommandHost();
  return (
    <header className="topbar">
      <div className="brand" aria-label="Coilwright">
        <span className="brand-mark" aria-hidden="true">⌇⌇</span> Coilwright
      </div>
      <div className="menu" ref={ref}>
        <button type="button" className="cmd" aria-haspopup="true" aria-expanded={open} onClick={() => setOpen(!open)} title="Sheets, examples and files">
          Sheets ▾
        </button>
        {open && (
          <div className="menu-pop" role="menu" onKeyDown={(e) => e.key === 'Escape' && setOpen(false)}>
            <div className="menu-group">
              <button role="menuitem" className="menu-item" onClick={() => { setOpen(false); host.newSheet(); }} title="Start an empty sheet (Alt+N)">New empty sheet <kbd>Alt+N</kbd></button>
              <button role="menuitem" className="menu-item" onClick={() => { setOpen(false); host.openFile(); }} title="Open a sheet or graph model file (Ctrl+O)">Open file… <kbd>Ctrl+O</kbd></button>
              <button role="menuitem" className="menu-item" onClick={() => { setOpen(false); host.saveFile(); }} title="Save this sheet as a file (Ctrl+S)">Save file <kbd>Ctrl+S</kbd></button>
              <button role="menuitem" className="menu-item" onClick={() => { setOpen(false); host.savePicture(); }} title="Save the annotated sheet as an SVG picture (Ctrl+Shift+S)">Save picture (SVG) <kbd>Ctrl+Shift+S</kbd></button>
            </div>
            <div className="menu-group" aria-label="Examples">
              <div className="menu-head">Examples</div>
              {EXAMPLES.map((ex) => (
                <button key={ex.key} role="menuitem" className="menu-item" data-example={ex.key} onClick={() => { setOpen(false); onExample(ex.key); }}>{ex.title}</button>
              ))}
            </div>
            <div className="menu-group" aria-label="Sheets kept in this browser">
              <div className="menu-head">Kept in this browser</div>
              {library.map((e: SheetEntry) => (
                <KeptRow key={e.id} entry={e} current={e.id === sheetId} onOpen={() => { setOpen(false); onSwitch(e.id); }} onForget={() => onForget(e.id)} onRename={onRename && ((t) => onRename(e.id, t))} />
              ))}
            </div>
          </div>
        )}
      </div>
      <div className="toolbar" role="toolbar" aria-label="Edit and view">
        <CommandButton id="undo" />
        <CommandButton id="redo" />
        <span className="sep" />
        <CommandButton id="copy" />
        <CommandButton id="paste" />
        <span className="sep" />
        <CommandButton id="zoom-out">−</CommandButton>
        <CommandButton id="fit" />
        <CommandButton id="zoom-in">+</CommandButton>
        <span className="sep" />
        <CommandButton id="open">Open</CommandButton>
        <CommandButton id="save">Save</CommandButton>
        <CommandButton id="save-picture">SVG</CommandButton>
      </div>
      <SharePanel />
      <CommandButton id="command-list">Commands</CommandButton>
      <KeysList />
      <div className="sheet-title" title="Sheet title (edit it in Details with nothing selected)">{title}</div>
    </header>
  );
}

/** Every command with its keys, one click away. */
function KeysList() {
  const { open, setOpen, ref } = usePopover();
  return (
    <div className="menu" ref={ref}>
      <button type="button" className="cmd" aria-expanded={open} aria-haspopup="dialog" title="All commands and their keys" onClick={() => setOpen(!open)}>
        Keys
      </button>
      {open && (
        <div className="menu-pop keys-pop" role="dialog" aria-label="Commands and keys" onKeyDown={(e) => e.key === 'Escape' && setOpen(false)}>
          <table>
            <tbody>
              {COMMANDS.map((c) => (
                <tr key={c.id}>
                  <th scope="row">{c.label}</th>
                  <td>{c.keys.map((k) => <kbd key={k}>{keyLabel(k)}</kbd>)}</td>
                  <td className="muted">{c.hint}</td>
                </tr>
              ))}
              <tr><th scope="row">Move the view</th><td><kbd>Space</kbd>+drag</td><td className="muted">or drag with the middle button; the wheel zooms, Shift+wheel scrolls</td></tr>
              <tr><th scope="row">While placing</th><td><kbd>←</kbd><kbd>→</kbd><kbd>↑</kbd><kbd>↓</kbd> <kbd>Enter</kbd></td><td className="muted">the part waits at a free spot beside the last one: arrows move it a grid step (Shift: five), <kbd>.</kbd> <kbd>,</kbd> turn it, <kbd>F</kbd> flips it, Enter drops it</td></tr>
              <tr><th scope="row">While wiring</th><td><kbd>←</kbd><kbd>→</kbd><kbd>↑</kbd><kbd>↓</kbd> <kbd>[</kbd><kbd>]</kbd> <kbd>Enter</kbd></td><td className="muted">arrows move the pin cursor to the nearest pin that way, [ and ] step through the pins; Enter starts the wire there, and Enter at another pin ends it</td></tr>
              <tr><th scope="row">In an analysis view</th><td><kbd>Escape</kbd></td><td className="muted">closes the view and hands the keyboard back to the drawing</td></tr>
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
