import { http } from './http'

/** Bytes the workspace's files take against its quota (GET /api/workspace/storage). */
export interface StorageUse {
  usedBytes: number
  quotaBytes: number
  storedLogBytes: number
  photometricBytes: number
  stagedBytes: number
  stagedUploads: number
}
export const fetchStorageUse = () => http.get<StorageUse>('/workspace/storage')
