/** Routes pointer and key input to the active tool; a middle-button or Space drag pans whatever the tool. */
import type { PartKind } from '../model/sheet';
import type { EditorStore, ToolName } from '../store/types';
import type { KeyInput, PointerInput, ToolMachine } from './machine';
import { PanTool } from './panTool';
import { PlaceTool } from './placeTool';
import { SelectTool } from './selectTool';
import { WireTool } from './wireTool';

export class ToolController {
  readonly select: SelectTool;
  readonly wire: WireTool;
  readonly place: PlaceTool;
  readonly pan: PanTool;
  spaceHeld = false;
  private panning = false;

  constructor(readonly store: EditorStore) {
    this.select = new SelectTool(store);
    this.wire = new WireTool(store);
    this.place = new PlaceTool(store);
    this.pan = new PanTool(store);
    this.place.onDone = () => this.use('select');
  }

  get active(): ToolMachine {
    return this[this.store.getState().tool];
  }

  use(tool: ToolName): void {
    const current = this.store.getState().tool;
    if (current !== tool) this.active.exit();
    this.store.setState({ tool });
    this.active.enter();
  }

  startPlacing(kind: PartKind): void {
    this.use('place');
    this.place.begin(kind);
  }

  down(e: PointerInput): void {
    if (e.button === 1 || (e.button === 0 && this.spaceHeld)) {
      this.panning = true;
      this.pan.onDown(e);
      return;
    }
    this.active.onDown(e);
  }

  move(e: PointerInput): void {
    if (this.panning) return this.pan.onMove(e);
    this.active.onMove(e);
  }

  up(e: PointerInput): void {
    if (this.panning) {
      this.panning = false;
      this.pan.onUp();
      return;
    }
    this.active.onUp(e);
  }

  key(k: KeyInput): boolean {
    return this.active.onKey(k);
  }
}
