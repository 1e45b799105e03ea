/** Types for mariadb.mjs (plain JS so it runs before `npm ci`). */
export interface MariaDBServer {
  pid: number;
  port: number;
  socket: string;
  dataDir: string;
  sql(statement: string): string;
  stop(): Promise<void>;
  exited: Promise<number | null>;
}
export function findProgram(name: string): string | null;
export function hasMariaDB(): boolean;
export function freePort(): Promise<number>;
export function startMariaDB(opts: { dataDir: string; port: number; log?: (msg: string) => void }): Promise<MariaDBServer>;
export function ensureDatabase(server: MariaDBServer, opts: { name: string; user: string; password: string; allDatabases?: boolean }): void;
