import "server-only";
import crypto from "node:crypto";
import fs from "node:fs/promises";
import path from "node:path";
import type { PhotoStorage } from ".";

const SAFE_KEY = /^[a-z0-9][a-z0-9/_-]{0,200}$/;

export class LocalDiskStorage implements PhotoStorage {
  constructor(private readonly root: string) {}

  private file(key: string): string {
    if (!SAFE_KEY.test(key) || key.includes("..")) throw new Error("unsafe storage key");
    return path.join(path.resolve(this.root), key);
  }

  async put(key: string, bytes: Buffer): Promise<void> {
    const target = this.file(key);
    await fs.mkdir(path.dirname(target), { recursive: true });
    // Write aside, flush, then rename: a reader never sees half a file.
    const temp = `${target}.${crypto.randomBytes(6).toString("hex")}.part`;
    const handle = await fs.open(temp, "w");
    try {
      await handle.writeFile(bytes);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await fs.rename(temp, target);
  }

  async get(key: string): Promise<Buffer | null> {
    try {
      return await fs.readFile(this.file(key));
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    await fs.rm(this.file(key), { force: true });
  }
}
