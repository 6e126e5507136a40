/** Panning by dragging (with the middle button, with Space held, or with the hand tool). idle → panning → idle */
import { ToolMachine, type PointerInput } from './machine';

export class PanTool extends ToolMachine {
  private last = { x: 0, y: 0 };

  override onDown(e: PointerInput): void {
    this.last = { x: e.sx, y: e.sy };
    this.go('panning');
  }

  override onMove(e: PointerInput): void {
    if (this.state !== 'panning') return;
    const v = this.store.getState().view;
    this.store.setState({ view: { ...v, x: v.x + e.sx - this.last.x, y: v.y + e.sy - this.last.y } });
    this.last = { x: e.sx, y: e.sy };
  }

  override onUp(): void {
    if (this.state === 'panning') this.go('idle');
  }
}
