/**
 * The browser's print of the app is the SVG sheet: a print-only container
 * (outside the app's root) holds the exported SVG, and the print stylesheet
 * hides everything else. It is filled before printing, from our print command
 * or the browser's own (beforeprint), and the page is set to the chosen paper.
 */
import { useEffect, useRef, useState } from 'react';
import { createPortal } from 'react-dom';
import { PRINT_MARGIN_MM, type Paper } from '../../export/options';
import { useEditor } from '../editorContext';
import type { EditorStore } from '../../store/types';
import { exportLoaded, loadExport, setPrintPreparer, svgNow } from './outputs';
import { shareSettings } from './settings';
import './share.css';

/** Parse our SVG text as XML (never as HTML) and keep only what a picture needs. */
export function svgElement(svg: string): SVGSVGElement {
  const doc = new DOMParser().parseFromString(svg, 'image/svg+xml');
  const root = doc.documentElement;
  if (root.localName !== 'svg' || doc.getElementsByTagName('parsererror').length) throw new Error('the sheet picture is not well-formed');
  // the export writes no scripts or handlers; whatever a plot might have smuggled in goes anyway
  for (const el of [...root.querySelectorAll('script, foreignObject, iframe')]) el.remove();
  for (const el of [root, ...root.querySelectorAll('*')]) {
    for (const a of [...el.attributes]) if (/^on/i.test(a.name) || /^\s*javascript:/i.test(a.value)) el.removeAttribute(a.name);
  }
  return document.importNode(root, true) as unknown as SVGSVGElement;
}

const pageRule = (paper: Paper) => `@page { size: ${paper === 'A4' ? 'A4' : 'letter'} landscape; margin: ${PRINT_MARGIN_MM}mm; }`;

export function PrintSheet() {
  const { store } = useEditor();
  const box = useRef<HTMLDivElement>(null);
  const [paper, setPaper] = useState<Paper>(shareSettings.getState().paper);

  useEffect(() => {
    const fill = (m: NonNullable<ReturnType<typeof exportLoaded>>, st: EditorStore) => {
      if (!box.current) return;
      box.current.replaceChildren(svgElement(svgNow(st, m).svg));
      setPaper(shareSettings.getState().paper);
    };
    setPrintPreparer(async (st) => fill(await loadExport(), st));
    const before = () => {
      const m = exportLoaded();
      if (m) fill(m, store);
    };
    // load the export code soon, so that the browser's own print finds it
    const idle = setTimeout(() => void loadExport(), 1500);
    window.addEventListener('beforeprint', before);
    return () => {
      clearTimeout(idle);
      window.removeEventListener('beforeprint', before);
    };
  }, [store]);

  return createPortal(
    <div className="print-sheet" data-testid="print-sheet" aria-hidden="true">
      <style>{`@media print { ${pageRule(paper)} }`}</style>
      <div ref={box} />
    </div>,
    document.body,
  );
}
