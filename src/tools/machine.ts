/** Tools are explicit state machines fed with pointer and key input in sheet coordinates. */
import type { EditorStore } from '../store/types';

export interface PointerInput {
  /** sheet coordinates */
  x: number;
  y: number;
  /** screen coordinates inside the canvas */
  sx: number;
  sy: number;
  button: number;
  shift: boolean;
  mod: boolean;
  alt: boolean;
  /** click count (2 for a double click) */
  detail?: number;
}

export interface KeyInput { key: string; shift: boolean; mod: boolean; alt: boolean }

export abstract class ToolMachine {
  state = 'idle';
  /** every state entered, oldest first (tests read it) */
  readonly trail: string[] = ['idle'];

  constructor(protected readonly store: EditorStore) {}

  protected go(next: string): void {
    this.state = next;
    this.trail.push(next);
  }

  /** hit tolerance in sheet units: a few screen pixels at the current zoom */
  protected tol(px = 6): number {
    return px / this.store.getState().view.zoom;
  }

  enter(): void {}
  exit(): void {}
  onDown(_e: PointerInput): void {}
  onMove(_e: PointerInput): void {}
  onUp(_e: PointerInput): void {}
  /** returns true when the key was used */
  onKey(_k: KeyInput): boolean {
    return false;
  }
}
