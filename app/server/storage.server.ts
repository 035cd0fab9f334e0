import type { S3Client } from "@aws-sdk/client-s3";
import { env } from "./env.server.ts";

/**
 * The object store behind photos, through the AWS S3 SDK: the local stand-in (s3rver) in
 * development and tests, any S3-compatible service in production (README, "Photos and storage").
 * The bucket stays private; the app serves its objects through a route that checks the role.
 * The SDK (about 20 MB in memory) is loaded on the first photo, not when the server starts.
 */

const sdk = () => import("@aws-sdk/client-s3");

declare global {
  // One client per process; it keeps its connections alive between requests.
  var __sternpostS3: S3Client | undefined;
}

export async function s3Client(): Promise<S3Client> {
  const { S3Client } = await sdk();
  const e = env();
  globalThis.__sternpostS3 ??= new S3Client({
    endpoint: e.S3_ENDPOINT,
    region: e.S3_REGION,
    forcePathStyle: e.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY },
    // Recent SDKs add CRC checksums to every request and check them on every answer; many
    // S3-compatible stores (the stand-in included) do not speak that, so only when an API needs it.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  return globalThis.__sternpostS3;
}

const bucket = () => env().S3_BUCKET;

const isMissing = async (error: unknown) =>
  error instanceof (await sdk()).S3ServiceException &&
  (error.name === "NoSuchKey" || error.name === "NotFound" || error.$metadata.httpStatusCode === 404);

export async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
  const { PutObjectCommand } = await sdk();
  await (
    await s3Client()
  ).send(
    new PutObjectCommand({
      Bucket: bucket(),
      Key: key,
      Body: body,
      ContentType: contentType,
      ContentLength: body.byteLength,
    }),
  );
}

/** The object's bytes, or undefined when the store has no such key. */
export async function getObject(key: string): Promise<Uint8Array | undefined> {
  try {
    const { GetObjectCommand } = await sdk();
    const answer = await (await s3Client()).send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return answer.Body ? await answer.Body.transformToByteArray() : new Uint8Array();
  } catch (error) {
    if (await isMissing(error)) return undefined;
    throw error;
  }
}

/** The object's size, or undefined when the store has no such key. */
export async function headObject(key: string): Promise<{ bytes: number } | undefined> {
  try {
    const { HeadObjectCommand } = await sdk();
    const answer = await (await s3Client()).send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return { bytes: answer.ContentLength ?? 0 };
  } catch (error) {
    if (await isMissing(error)) return undefined;
    throw error;
  }
}
