// Types for the plain-Node set-up helpers, so TypeScript tests and scripts can use them.
import type { ChildProcess } from "node:child_process";

export const root: string;
export const buildDir: string;
export function log(msg: string): void;
export function postgresBin(): string;
export function freePort(): Promise<number>;
export type Cluster = {
  dir: string;
  port: number;
  baseUrl: string;
  stop(): boolean;
  start(): boolean;
  restart(): boolean;
  psql(sqlText: string, database?: string): void;
};
export const devDatabase: { role: string; database: string; passwordFile: string };
export function ensureAppRole(cluster: Cluster, options?: { role: string; database: string; passwordFile: string }): string;
export function devDatabaseUrl(port?: number): string;
export function startCluster(dataDir: string, port: number, options?: { durable?: boolean }): Cluster;
export function removeDir(dir: string): void;
export function runTsx(file: string, args: string[], env: Record<string, string>): void;
export function startFakes(env?: Record<string, string>): Promise<{ child: ChildProcess; settings: Record<string, string> }>;
export function buildApp(): void;
export function spawnApp(env: Record<string, string>, options?: { quiet?: boolean }): ChildProcess;
export function stopChild(child: ChildProcess, graceMs?: number): Promise<void>;
export function startApp(env: Record<string, string>, options?: { quiet?: boolean }): Promise<ChildProcess>;
