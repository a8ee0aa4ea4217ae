import "server-only";
import { LocalDiskStorage } from "./local-disk";
import { S3Storage, s3SettingsFromEnv } from "./s3";

/** Where photo bytes live: local disk by default; an S3 bucket when configured. */
export interface PhotoStorage {
  /** Stores bytes under a server-made key; visible only once complete. */
  put(key: string, bytes: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<Buffer | null>;
  delete(key: string): Promise<void>;
}

let storage: PhotoStorage | undefined;

export function photoStorage(): PhotoStorage {
  if (!storage) {
    const s3 = s3SettingsFromEnv();
    storage = s3 ? new S3Storage(s3) : new LocalDiskStorage(process.env.LODEBOOK_PHOTO_DIR ?? "./data/photos");
  }
  return storage;
}

/** For tests: use another store. */
export function setPhotoStorage(next: PhotoStorage | undefined): void {
  storage = next;
}
