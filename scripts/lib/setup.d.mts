export const ROOT: string
export const DATA_DIR: string
export function log(msg: string): void
export function run(cmd: string, args: string[], opts?: Record<string, unknown>): void
export function ensureNodeModules(): void
export function ensurePostgresBinaries(): string
export function ensureChromium(): string
export function portIsFree(port: number): Promise<boolean>
export function findFreePort(start: number): Promise<number>
export function startCluster(opts: { bin: string; dir: string; port: number; database: string }): { url: string; stop(): void }
export function clusterPort(dir: string): number | null
