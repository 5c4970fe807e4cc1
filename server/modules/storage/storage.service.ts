/**
 * How much room a workspace's files take: stored discharge-log files and photometric files, plus
 * uploads waiting to be saved (until they expire). New bytes are admitted under a per-workspace
 * advisory lock, so two uploads at once cannot both slip under the quota, in any app process.
 */
import type { EntityManager } from 'typeorm'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { AppError } from '../../errors/app-error'

export interface StorageUse {
  usedBytes: number
  quotaBytes: number
  storedLogBytes: number
  photometricBytes: number
  stagedBytes: number
  stagedUploads: number
}

const MB = 1024 * 1024
/** "12.3 MB" for people; bytes stay in the JSON. */
export function megabytes(bytes: number): string {
  return `${(bytes / MB).toFixed(bytes < 10 * MB ? 1 : 0)} MB`
}

export async function storageUse(workspaceId: string, m: EntityManager = dataSource.manager): Promise<StorageUse> {
  const rows: Array<{ logs: string; photometry: string; staged: string; staged_count: string; quota: string | null }> = await m.query(
    `SELECT (SELECT coalesce(sum(size), 0) FROM discharge_files WHERE workspace_id = $1) AS logs,
            (SELECT coalesce(sum(octet_length(raw_text)), 0) FROM photometric_files WHERE workspace_id = $1) AS photometry,
            (SELECT coalesce(sum(size), 0) FROM staged_uploads WHERE workspace_id = $1 AND expires_at > now()) AS staged,
            (SELECT count(*) FROM staged_uploads WHERE workspace_id = $1 AND expires_at > now()) AS staged_count,
            (SELECT storage_quota_bytes FROM workspaces WHERE id = $1) AS quota`,
    [workspaceId],
  )
  const r = rows[0]
  const storedLogBytes = Number(r.logs)
  const photometricBytes = Number(r.photometry)
  const stagedBytes = Number(r.staged)
  return {
    usedBytes: storedLogBytes + photometricBytes + stagedBytes,
    quotaBytes: r.quota === null ? config().storage.quotaBytes : Number(r.quota),
    storedLogBytes,
    photometricBytes,
    stagedBytes,
    stagedUploads: Number(r.staged_count),
  }
}

export class StorageFullError extends AppError {
  constructor(use: StorageUse, adding: number) {
    super(
      507,
      'storage_full',
      `This workspace has no room for ${megabytes(adding)} more: it uses ${megabytes(use.usedBytes)} of its ${megabytes(use.quotaBytes)} ` +
        `(stored discharge logs ${megabytes(use.storedLogBytes)}, photometric files ${megabytes(use.photometricBytes)}, uploads waiting to be saved ${megabytes(use.stagedBytes)}). ` +
        'Delete logs or files you no longer need, or let unsaved uploads expire (after an hour); the operator can raise the quota.',
      [{ path: 'file', message: `does not fit: ${megabytes(Math.max(0, use.quotaBytes - use.usedBytes))} left` }],
      { storage: use },
    )
  }
}

/** Refuses at once when the workspace cannot take `bytes` more (a cheap check before reading a body). */
export async function assertRoomFor(workspaceId: string, bytes: number): Promise<void> {
  const use = await storageUse(workspaceId)
  if (use.usedBytes + bytes > use.quotaBytes || (bytes === 0 && use.usedBytes >= use.quotaBytes)) throw new StorageFullError(use, bytes)
}

/**
 * Admits `bytes` new bytes for the workspace inside transaction `m`: takes the workspace's storage
 * lock (held until the transaction ends, so the caller's insert is counted before the next check)
 * and refuses with 507 past the quota. `staged` bytes also count against the server-wide room for
 * uploads on disk.
 */
export async function admitBytes(m: EntityManager, workspaceId: string, bytes: number, opts: { staged?: boolean } = {}): Promise<void> {
  await m.query(`SELECT pg_advisory_xact_lock(hashtext('workspace-storage'), hashtext($1))`, [workspaceId])
  const use = await storageUse(workspaceId, m)
  if (use.usedBytes + bytes > use.quotaBytes) throw new StorageFullError(use, bytes)
  if (opts.staged) {
    const all: Array<{ staged: string }> = await m.query('SELECT coalesce(sum(size), 0) AS staged FROM staged_uploads WHERE expires_at > now()', [])
    if (Number(all[0].staged) + bytes > config().storage.stagedTotalBytes) {
      throw new AppError(
        507,
        'storage_full',
        'The server has no room for more uploads waiting to be saved just now; try again in an hour, or save or discard the uploads you have open.',
        [{ path: 'file', message: 'no room on the server just now' }],
      )
    }
  }
}
