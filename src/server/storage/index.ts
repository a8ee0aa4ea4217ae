import "server-only";
import { serverEnv } from "../env";
import { LocalDiskStorage } from "./local-disk";
import { S3Storage, s3SettingsFromEnv } from "./s3";

/** Where photo bytes live: local disk by default; an S3 bucket when configured. */
export interface PhotoStorage {
  /** Stores bytes under a server-made key; visible only once complete. */
  put(key: string, bytes: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<Buffer | null>;
  delete(key: string): Promise<void>;
}

let configured: { key: string; storage: PhotoStorage } | undefined;
let override: PhotoStorage | undefined;

/** The store the settings name, made again only when the settings change. */
export function photoStorage(): PhotoStorage {
  if (override) return override;
  const s3 = s3SettingsFromEnv();
  const key = s3 ? JSON.stringify(s3) : `disk:${serverEnv().LODEBOOK_PHOTO_DIR}`;
  if (configured?.key !== key) configured = { key, storage: s3 ? new S3Storage(s3) : new LocalDiskStorage(serverEnv().LODEBOOK_PHOTO_DIR) };
  return configured.storage;
}

/** For tests: use another store. */
export function setPhotoStorage(next: PhotoStorage | undefined): void {
  override = next;
}
