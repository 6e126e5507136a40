/** The editor store and tool controller handed down to React components. */
import { createContext, useContext } from 'react';
import { useStore } from 'zustand';
import type { ToolController } from '../tools/controller';
import type { EditorState, EditorStore } from '../store/types';

export interface EditorHandles {
  store: EditorStore;
  tools: ToolController;
}

export const EditorContext = createContext<EditorHandles | null>(null);

export function useEditor(): EditorHandles {
  const h = useContext(EditorContext);
  if (!h) throw new Error('EditorContext missing');
  return h;
}

export function useEditorState<T>(selector: (s: EditorState) => T): T {
  return useStore(useEditor().store, selector);
}
