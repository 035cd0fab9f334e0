// Copying the photo objects out of, and back into, the S3-compatible store.
import { GetObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { createHash } from "node:crypto";

export interface StoreConfig {
  endpoint: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
}

export const storeFromEnv = (e: NodeJS.ProcessEnv = process.env): StoreConfig => ({
  endpoint: e.S3_ENDPOINT ?? "http://127.0.0.1:4569",
  region: e.S3_REGION ?? "us-east-1",
  bucket: e.S3_BUCKET ?? "sternpost-photos",
  accessKeyId: e.S3_ACCESS_KEY_ID ?? "S3RVER",
  secretAccessKey: e.S3_SECRET_ACCESS_KEY ?? "S3RVER",
  forcePathStyle: (e.S3_FORCE_PATH_STYLE ?? "true") === "true",
});

export function client(c: StoreConfig) {
  return new S3Client({
    endpoint: c.endpoint,
    region: c.region,
    forcePathStyle: c.forcePathStyle,
    credentials: { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey },
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
}

export const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/** Every object under the prefix, page by page. */
export async function* listObjects(c: StoreConfig, prefix: string) {
  const s3 = client(c);
  let token: string | undefined;
  do {
    const page = await s3.send(
      new ListObjectsV2Command({ Bucket: c.bucket, Prefix: prefix, ContinuationToken: token }),
    );
    for (const o of page.Contents ?? []) if (o.Key) yield o.Key;
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
}

export async function getBytes(c: StoreConfig, key: string): Promise<Uint8Array> {
  const answer = await client(c).send(new GetObjectCommand({ Bucket: c.bucket, Key: key }));
  return answer.Body ? answer.Body.transformToByteArray() : new Uint8Array();
}

export async function putBytes(c: StoreConfig, key: string, body: Uint8Array, contentType?: string) {
  await client(c).send(
    new PutObjectCommand({ Bucket: c.bucket, Key: key, Body: body, ContentType: contentType }),
  );
}
