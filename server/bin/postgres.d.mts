export type Cluster = {
  port: number;
  password: string;
  dir: string;
  adminUrl: string;
  urlFor: (db: string) => string;
  psql: (sql: string, db?: string) => string;
  stop: () => void;
};
export function findPgBin(): string | null;
export function ensurePostgresInstalled(log?: (msg: string) => void): string;
export function ensureChromiumInstalled(log?: (msg: string) => void): string;
export function postgresCanUse(dir: string): boolean;
export function freePort(): Promise<number>;
export function startCluster(opts: { bin: string; dir: string; port: number; log?: (msg: string) => void }): Cluster;
export function ensureDatabase(cluster: Cluster, name: string): void;
export function clusterDir(preferred: string, fallbackName: string): string;
export function run(cmd: string, args: string[], opts?: Record<string, unknown>): { stdout: string; stderr: string };
