/**
 * The drawing surface. Konva layers are drawn by our own scene functions that
 * read the store directly; a store subscription (outside React) asks only the
 * layers that changed to redraw, and draws new solve results at once rather
 * than waiting for the next frame. Pointer input goes to the tools.
 */
import { useEffect, useRef, useState } from 'react';
import { Layer, Shape, Stage } from 'react-konva';
import type Konva from 'konva';
import { deriveTopology, type Topology } from '../model/topology';
import { PART_DEFS } from '../model/parts/registry';
import type { Sheet } from '../model/sheet';
import { screenToWorld, zoomAt } from '../store/actions';
import { overlayDrawn, sheetProbe } from '../store/probe';
import type { EditorState } from '../store/types';
import type { PointerInput } from '../tools/machine';
import { useEditor, useEditorState } from './editorContext';
import { culpritIds, drawOverlay } from '../canvas/drawOverlay';
import { drawPrims } from '../canvas/drawPrims';
import { drawGrid, drawSheet, visibleRect } from '../canvas/drawSheet';
import { DragDrawing } from '../canvas/dragDrawing';
import { nodeNear } from '../canvas/hover';
import { noticesOf } from './Notices';
import { THEME } from '../canvas/theme';
import { analysisStore } from '../store/analysisStore';
import { instantChanged, instantOverlay } from './analysis/timeOverlay';

/** longest an edit waits (one frame) for its solve so both show together; the editor itself never blocks on the solver */
const HOLD_MS = 16;

type Ctx = Konva.Context & { _context: CanvasRenderingContext2D };
const native = (ctx: Konva.Context) => (ctx as Ctx)._context;

function memoOne<A, R>(f: (a: A) => R): (a: A) => R {
  let last: A | undefined;
  let value: R | undefined;
  return (a: A) => {
    if (a !== last || value === undefined) {
      last = a;
      value = f(a);
    }
    return value;
  };
}

const sameSet = (a: Set<string>, b: Set<string>) => a.size === b.size && [...a].every((x) => b.has(x));

export function SheetCanvas() {
  const { store, tools } = useEditor();
  const host = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState({ width: 800, height: 600 });
  const sizeRef = useRef(size);
  sizeRef.current = size;
  const grid = useRef<Konva.Layer>(null);
  const sheetLayer = useRef<Konva.Layer>(null);
  const overlay = useRef<Konva.Layer>(null);
  const ui = useRef<Konva.Layer>(null);
  const tool = useEditorState((s) => s.tool);

  const caches = useRef({
    selection: memoOne((ids: string[]) => new Set(ids)),
    topology: memoOne((sheet: Sheet): Topology => deriveTopology(sheet)),
    hazards: memoOne((s: Pick<EditorState, 'solve' | 'derived'>) => new Set(noticesOf({ ...s, notice: null }).filter((n) => n.tone === 'hazard' && n.partId).map((n) => n.partId!))),
  }).current;
  const hazardKey = useRef<{ solve: EditorState['solve'] | null; derived: EditorState['derived']; key: Pick<EditorState, 'solve' | 'derived'> | null }>({ solve: null, derived: null, key: null });
  /** one object per (solve, derived) pair, so the hazard set is worked out once for each */
  const hazardsOf = (s: EditorState) => {
    const h = hazardKey.current;
    if (h.solve !== s.solve || h.derived !== s.derived || !h.key) hazardKey.current = { solve: s.solve, derived: s.derived, key: { solve: s.solve, derived: s.derived } };
    return caches.hazards(hazardKey.current.key!);
  };

  /** the topology of the committed sheet (the bridge derives it on every edit); kept while a drag is shown */
  const topologyOf = (s: EditorState): Topology =>
    s.derived && s.derived.source === s.sheet ? s.derived.topology : caches.topology(s.sheet);

  const drawnHazards = useRef<Set<string>>(new Set());
  const gridFunc = (ctx: Konva.Context) => drawGrid(native(ctx), store.getState().view, sizeRef.current.width, sizeRef.current.height);

  const dragDraw = useRef(new DragDrawing()).current;

  const sheetFunc = (ctx: Konva.Context) => {
    const t0 = performance.now();
    const s = store.getState();
    const c = native(ctx);
    const { width, height } = sizeRef.current;
    drawnHazards.current = hazardsOf(s);
    const options = {
      selection: caches.selection(s.selection),
      topology: topologyOf(s),
      culprits: s.solve.status === 'refused' ? culpritIds(s.solve.refusal) : new Set<string>(),
      hazards: hazardsOf(s),
      view: s.view,
      visible: visibleRect(s.view, width, height),
      style: s.symbols,
    };
    if (!s.preview) {
      dragDraw.reset();
      drawSheet(c, s.sheet, options);
    } else dragDraw.draw(c, s, options, width, height);
    sheetProbe.draws += 1;
    sheetProbe.ms += performance.now() - t0;
  };

  const overlayFunc = (ctx: Konva.Context) => {
    const s = store.getState();
    const solve = s.solve;
    // the time view's cursor on a run of this sheet: the circuit at that instant instead of its phasors
    const instant = solve.status === 'refused' ? null : instantOverlay(s);
    drawOverlay(native(ctx), {
      sheet: s.sheet,
      hidden: s.preview ? caches.selection(s.selection) : null,
      result: instant ? instant.result : solve.result,
      circuit: instant ? instant.circuit : solve.circuit,
      instant: instant ? { maxAmps: instant.maxAmps, timeS: instant.timeS } : null,
      refusal: solve.status === 'refused' ? solve.refusal : null,
      stale: solve.stale || solve.status === 'refused',
      view: s.view,
      visible: visibleRect(s.view, sizeRef.current.width, sizeRef.current.height),
      hoverNode: s.hoverNode,
      readout: s.readout,
    });
    overlayDrawn(solve.seq);
  };

  const uiFunc = (ctx: Konva.Context) => {
    const { view, ghost, wireDraft: draft, box, symbols, pinCursor } = store.getState();
    const c = native(ctx);
    c.save();
    c.translate(view.x, view.y);
    c.scale(view.zoom, view.zoom);
    c.lineCap = 'round';
    c.lineWidth = Math.max(1.4, 1 / view.zoom);
    if (ghost) drawPrims(c, ghost, PART_DEFS[ghost.kind].draw({ id: '', ref: '', ...PART_DEFS[ghost.kind].defaults, ...ghost }, symbols), THEME.ghost);
    if (draft) {
      c.strokeStyle = THEME.draft;
      c.setLineDash([6, 4]);
      c.beginPath();
      c.moveTo(draft[0], draft[1]);
      for (let i = 2; i < draft.length; i += 2) c.lineTo(draft[i], draft[i + 1]);
      c.stroke();
      c.setLineDash([]);
    }
    if (pinCursor) {
      // the keyboard's pin: a ring and a cross, visible on any background
      c.strokeStyle = THEME.draft;
      c.lineWidth = 2 / view.zoom;
      c.beginPath();
      c.arc(pinCursor.x, pinCursor.y, 7, 0, Math.PI * 2);
      c.moveTo(pinCursor.x - 11, pinCursor.y);
      c.lineTo(pinCursor.x + 11, pinCursor.y);
      c.moveTo(pinCursor.x, pinCursor.y - 11);
      c.lineTo(pinCursor.x, pinCursor.y + 11);
      c.stroke();
    }
    if (box) {
      c.fillStyle = THEME.selectFill;
      c.strokeStyle = THEME.select;
      c.lineWidth = 1 / view.zoom;
      c.fillRect(box.x0, box.y0, box.x1 - box.x0, box.y1 - box.y0);
      c.strokeRect(box.x0, box.y0, box.x1 - box.x0, box.y1 - box.y0);
    }
    c.restore();
  };

  useEffect(() => {
    const el = host.current;
    if (!el) return;
    let last = { width: el.clientWidth, height: el.clientHeight };
    const ro = new ResizeObserver(() => {
      const next = { width: el.clientWidth, height: el.clientHeight };
      if (next.width === last.width && next.height === last.height) return;
      // the drawing stays centred where it was when a panel opens, closes or is resized
      const v = store.getState().view;
      if (last.width > 0 && last.height > 0) store.setState({ view: { ...v, x: v.x + (next.width - last.width) / 2, y: v.y + (next.height - last.height) / 2 } });
      last = next;
      setSize(next);
    });
    ro.observe(el);
    setSize(last);
    return () => ro.disconnect();
  }, []);

  useEffect(() => {
    for (const l of [grid, sheetLayer, overlay, ui]) l.current?.batchDraw();
  }, [size]);

  useEffect(() => {
    // After an edit of the sheet the solve usually answers within a few
    // milliseconds: the edit and its new values are then painted together in
    // one frame instead of two. If the answer is late, the edit is drawn anyway.
    let held: ReturnType<typeof setTimeout> | null = null;
    const drawHeld = () => {
      if (held) clearTimeout(held);
      held = null;
      sheetLayer.current?.batchDraw();
      overlay.current?.batchDraw();
    };
    const unsubscribe = store.subscribe((s, p) => {
      if (s.view !== p.view) {
        for (const l of [grid, sheetLayer, overlay, ui]) l.current?.batchDraw();
        return;
      }
      if (s.solve !== p.solve) {
        if (held) {
          clearTimeout(held);
          held = null;
          sheetLayer.current?.draw();
        } else if (s.solve.status !== p.solve.status || !sameSet(hazardsOf(s), drawnHazards.current)) sheetLayer.current?.batchDraw();
        overlay.current?.draw(); // new values go on the sheet at once
      } else if (s.sheet !== p.sheet && s.preview === null && p.preview === null) {
        if (!held) held = setTimeout(drawHeld, HOLD_MS);
      } else {
        if (s.sheet !== p.sheet || s.preview !== p.preview || s.selection !== p.selection || s.symbols !== p.symbols) sheetLayer.current?.batchDraw();
        if (s.sheet !== p.sheet || s.hoverNode !== p.hoverNode || s.readout !== p.readout || (s.preview === null) !== (p.preview === null)) overlay.current?.batchDraw();
      }
      if (s.selection !== p.selection) sheetLayer.current?.batchDraw();
      if (s.ghost !== p.ghost || s.wireDraft !== p.wireDraft || s.box !== p.box || s.pinCursor !== p.pinCursor) ui.current?.batchDraw();
    });
    const unsubscribeTime = analysisStore.subscribe((a, b) => {
      if (instantChanged(a, b)) overlay.current?.batchDraw();
    });
    return () => {
      if (held) clearTimeout(held);
      unsubscribe();
      unsubscribeTime();
    };
  }, [store]);

  /** on a crowded sheet node tags show on hover */
  const hover = (i: PointerInput) => {
    const s = store.getState();
    const best = nodeNear(s, i, 14 / s.view.zoom);
    if (best !== s.hoverNode) store.setState({ hoverNode: best });
  };

  const lastDown = useRef({ t: 0, x: 0, y: 0 });
  const input = (e: React.PointerEvent, detail?: number): PointerInput => {
    const r = host.current!.getBoundingClientRect();
    const sx = e.clientX - r.left;
    const sy = e.clientY - r.top;
    const w = screenToWorld(store.getState().view, sx, sy);
    return { x: w.x, y: w.y, sx, sy, button: e.button, shift: e.shiftKey, mod: e.ctrlKey || e.metaKey, alt: e.altKey, detail };
  };

  useEffect(() => {
    const el = host.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const r = el.getBoundingClientRect();
      if (e.shiftKey) {
        const v = store.getState().view;
        store.setState({ view: { ...v, x: v.x - e.deltaY, y: v.y - e.deltaX } });
      } else zoomAt(store, Math.exp(-e.deltaY * 0.0015), e.clientX - r.left, e.clientY - r.top);
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, [store]);

  const cursor = tool === 'wire' || tool === 'place' ? 'crosshair' : tool === 'pan' ? 'grab' : 'default';
  return (
    <div
      ref={host}
      className="sheet-canvas"
      role="application"
      aria-label="Sheet drawing area. Use the tools on the left; arrow keys move the view, plus and minus zoom."
      tabIndex={0}
      style={{ cursor }}
      data-testid="sheet-canvas"
      onPointerDown={(e) => {
        host.current?.focus();
        host.current?.setPointerCapture(e.pointerId);
        const now = performance.now();
        const dbl = now - lastDown.current.t < 350 && Math.hypot(e.clientX - lastDown.current.x, e.clientY - lastDown.current.y) < 5;
        lastDown.current = { t: dbl ? 0 : now, x: e.clientX, y: e.clientY };
        if (e.button === 1) e.preventDefault();
        tools.down(input(e, dbl ? 2 : 1));
      }}
      onPointerMove={(e) => {
        const i = input(e);
        tools.move(i);
        if (e.buttons === 0) hover(i);
      }}
      onPointerUp={(e) => tools.up(input(e))}
      onPointerLeave={() => store.getState().ghost && store.setState({ ghost: null })}
      onContextMenu={(e) => e.preventDefault()}
    >
      <Stage width={size.width} height={size.height} listening={false}>
        <Layer ref={grid} listening={false}><Shape sceneFunc={gridFunc} /></Layer>
        <Layer ref={sheetLayer} listening={false}><Shape sceneFunc={sheetFunc} /></Layer>
        <Layer ref={overlay} listening={false}><Shape sceneFunc={overlayFunc} /></Layer>
        <Layer ref={ui} listening={false}><Shape sceneFunc={uiFunc} /></Layer>
      </Stage>
    </div>
  );
}
