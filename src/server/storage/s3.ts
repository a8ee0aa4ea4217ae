import "server-only";
import { serverEnv, type ServerEnv } from "../env";
import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import type { PhotoStorage } from ".";

export type S3Settings = { bucket: string; region: string; endpoint?: string; accessKeyId?: string; secretAccessKey?: string; prefix?: string };

/** Photo bytes in an S3-compatible bucket (an object appears whole or not at all). */
export class S3Storage implements PhotoStorage {
  private client: S3Client;
  constructor(private readonly s: S3Settings) {
    this.client = new S3Client({
      region: s.region,
      endpoint: s.endpoint,
      forcePathStyle: !!s.endpoint, // local fakes and most self-hosted stores want path-style URLs
      credentials: s.accessKeyId && s.secretAccessKey ? { accessKeyId: s.accessKeyId, secretAccessKey: s.secretAccessKey } : undefined,
    });
  }

  private key(key: string) {
    return `${this.s.prefix ?? ""}${key}`;
  }

  async put(key: string, bytes: Buffer, contentType: string): Promise<void> {
    await this.client.send(
      new PutObjectCommand({ Bucket: this.s.bucket, Key: this.key(key), Body: bytes, ContentType: contentType, ContentLength: bytes.length }),
    );
  }

  async get(key: string): Promise<Buffer | null> {
    try {
      const out = await this.client.send(new GetObjectCommand({ Bucket: this.s.bucket, Key: this.key(key) }));
      return out.Body ? Buffer.from(await out.Body.transformToByteArray()) : null;
    } catch (error) {
      if (error instanceof NoSuchKey || (error as { name?: string }).name === "NoSuchKey") return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.s.bucket, Key: this.key(key) }));
  }
}

/** S3 settings from the environment, when a bucket is configured. */
export function s3SettingsFromEnv(env: ServerEnv = serverEnv()): S3Settings | null {
  if (!env.LODEBOOK_S3_BUCKET) return null;
  return {
    bucket: env.LODEBOOK_S3_BUCKET,
    region: env.LODEBOOK_S3_REGION,
    endpoint: env.LODEBOOK_S3_ENDPOINT,
    accessKeyId: env.AWS_ACCESS_KEY_ID,
    secretAccessKey: env.AWS_SECRET_ACCESS_KEY,
    prefix: env.LODEBOOK_S3_PREFIX,
  };
}
