/**
 * Without a provider registered through analysisHook, the outputs read what
 * the analysis views show: the plots on screen in the analysis dock (copied
 * with their computed styles inlined, since the app's CSS does not travel
 * with the SVG) and the last finished sweep of the analysis store.
 */
import type { SweepTable } from '../../export/csv';
import type { PlotFragment } from '../../export/options';
import { analysisStore } from '../../store/analysisStore';

const DOCK = '[data-testid="analysis-dock"]';
const PROPS = [
  'fill', 'fill-opacity', 'stroke', 'stroke-width', 'stroke-opacity', 'stroke-dasharray', 'stroke-linecap', 'stroke-linejoin',
  'opacity', 'font-size', 'font-family', 'font-weight', 'font-style', 'text-anchor', 'dominant-baseline',
];

/** Whether the analysis dock shows any plot now. */
export function plotsShown(): boolean {
  return typeof document !== 'undefined' && !!document.querySelector(`${DOCK} svg`);
}

export function plotsOnScreen(): PlotFragment[] {
  if (typeof document === 'undefined') return [];
  const out: PlotFragment[] = [];
  const serializer = new XMLSerializer();
  for (const svg of document.querySelectorAll<SVGSVGElement>(`${DOCK} svg`)) {
    if (svg.parentElement?.closest('svg')) continue;
    const box = svg.getBoundingClientRect();
    if (!box.width || !box.height) continue;
    const clone = svg.cloneNode(true) as SVGSVGElement;
    const from = [svg, ...svg.querySelectorAll('*')];
    const to = [clone, ...clone.querySelectorAll('*')];
    from.forEach((el, i) => {
      const cs = getComputedStyle(el);
      const d = to[i];
      if (cs.display === 'none' || cs.visibility === 'hidden') {
        d.remove();
        return;
      }
      for (const p of PROPS) {
        const v = cs.getPropertyValue(p);
        if (v) d.setAttribute(p, v);
      }
      d.removeAttribute('class');
      d.removeAttribute('style');
    });
    const width = Number(svg.getAttribute('width')) || box.width;
    const height = Number(svg.getAttribute('height')) || box.height;
    clone.setAttribute('width', String(width));
    clone.setAttribute('height', String(height));
    // the sweep's legend is HTML beside the plot: its trace names go into the title
    const traces = svg.closest('[data-testid="sweep-panel"]') ? analysisStore.getState().sweep.shown.map((t) => t.label).join(', ') : '';
    const full = [svg.getAttribute('aria-label') ?? '', traces].filter(Boolean).join(': ');
    const title = full.length > 70 ? `${full.slice(0, 69)}…` : full;
    out.push({ title: title || undefined, svg: serializer.serializeToString(clone), width, height });
  }
  return out;
}

/** The last finished sweep of the sweep view, as a table; null when none has finished. */
export function sweepFromAnalysisStore(): SweepTable | null {
  const sw = analysisStore.getState().sweep;
  if (sw.status !== 'done' || !sw.answer || sw.answer.traces.length !== sw.shown.length) return null;
  const answer = sw.answer;
  return {
    frequenciesHz: answer.frequenciesHz,
    traces: sw.shown.map((t, i) => ({ label: t.label, unit: t.unit, values: answer.traces[i] })),
    ...(answer.values && sw.shownOver ? { swept: { label: sw.shownOver.label, unit: sw.shownOver.unit, values: answer.values } } : {}),
  };
}
