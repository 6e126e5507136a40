export const cliOut: string;
export function buildCli(): Promise<void>;
