/** The left column: tools and the shelf of parts to place. */
import { PART_DEFS, SHELF_KINDS } from '../model/parts/registry';
import { CommandButton } from './CommandButton';
import { PartIcon } from './icons';
import { useEditorState } from './editorContext';

export function PartsShelf() {
  const tool = useEditorState((s) => s.tool);
  const ghostKind = useEditorState((s) => s.ghost?.kind);
  const symbols = useEditorState((s) => s.symbols);
  const amplitudes = useEditorState((s) => s.sheet.amplitudes);
  const readout = useEditorState((s) => s.readout);
  return (
    <nav className="shelf" aria-label="Tools and parts">
      <h2 className="panel-title">Tools</h2>
      <div className="shelf-tools">
        <CommandButton id="tool-pick" pressed={tool === 'select'} />
        <CommandButton id="tool-wire" pressed={tool === 'wire'} />
        <CommandButton id="tool-hand" pressed={tool === 'pan'} />
      </div>
      <h2 className="panel-title">Parts</h2>
      <div className="shelf-parts">
        {SHELF_KINDS.map((k) => (
          <CommandButton key={k} id={`place-${k}`} pressed={tool === 'place' && ghostKind === k} className="part-btn">
            <PartIcon kind={k} style={symbols} />
            <span className="part-name">{PART_DEFS[k].label}</span>
            <kbd>{PART_DEFS[k].shelfKey}</kbd>
          </CommandButton>
        ))}
      </div>
      <h2 className="panel-title">Arrange</h2>
      <div className="shelf-tools">
        <CommandButton id="turn" />
        <CommandButton id="mirror" />
        <CommandButton id="swap-dot" />
        <CommandButton id="link" />
        <CommandButton id="duplicate" />
        <CommandButton id="remove" />
      </div>
      <h2 className="panel-title">View</h2>
      <div className="shelf-view" role="group" aria-label="Move the view">
        <span />
        <CommandButton id="pan-up">↑</CommandButton>
        <span />
        <CommandButton id="pan-left">←</CommandButton>
        <CommandButton id="fit">⤢</CommandButton>
        <CommandButton id="pan-right">→</CommandButton>
        <span />
        <CommandButton id="pan-down">↓</CommandButton>
        <span />
      </div>
      <div className="shelf-tools wide">
        <CommandButton id="amplitudes">{amplitudes === 'rms' ? 'Amplitudes: RMS' : 'Amplitudes: peak'}</CommandButton>
        <CommandButton id="readout">{readout === 'polar' ? 'Phasors: ∠ degrees' : 'Phasors: re + j im'}</CommandButton>
        <CommandButton id="symbols">{symbols === 'iec' ? 'Symbols: IEC 60617' : 'Symbols: IEEE 315'}</CommandButton>
      </div>
    </nav>
  );
}
