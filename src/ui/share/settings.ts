/** What the export panel remembers while the page is open: paper, notes, whether plots go in, and the last share link made. */
import { createStore } from 'zustand/vanilla';
import type { Paper } from '../../export/options';

export interface ShareSettings {
  paper: Paper;
  notes: string;
  includePlots: boolean;
  open: boolean;
  /** the link made for the sheet, or why none could be made */
  link: { url: string; chars: number } | { problem: string } | null;
}

export const shareSettings = createStore<ShareSettings>()(() => ({ paper: 'A4', notes: '', includePlots: true, open: false, link: null }));
