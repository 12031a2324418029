export const SERVER_OUT: string;
export const SERVER_ENTRIES: Record<string, string>;
export function buildServer(outdir?: string): Promise<void>;
