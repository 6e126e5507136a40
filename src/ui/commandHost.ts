import { createContext, useContext } from 'react';
import type { CommandHost } from '../tools/commands';

export const CommandHostContext = createContext<CommandHost | null>(null);

export function useCommandHost(): CommandHost {
  const h = useContext(CommandHostContext);
  if (!h) throw new Error('CommandHostContext missing');
  return h;
}
