// The local S3 stand-in (s3rver) on loopback, with the photos bucket made. `npm start` runs it as a
// script (files in .data/s3); the test setups and the benchmark start their own through startS3Fake.
import { mkdirSync } from "node:fs";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { pathToFileURL } from "node:url";
// s3rver ships no type declarations; the little of it used here is typed below.
// @ts-expect-error TS7016
import S3rver from "s3rver";

interface S3rverInstance {
  run(): Promise<AddressInfo>;
  close(): Promise<void>;
}
type S3rverClass = new (options: {
  address: string;
  port: number;
  directory: string;
  silent: boolean;
  configureBuckets: { name: string }[];
}) => S3rverInstance;

export interface S3Fake {
  /** http://127.0.0.1:PORT, the S3_ENDPOINT to use. */
  endpoint: string;
  port: number;
  close(): Promise<void>;
}

/** Starts s3rver on 127.0.0.1 (port 0: any free port) keeping its objects in `directory`. */
export async function startS3Fake({
  port,
  directory,
  bucket,
}: {
  port: number;
  directory: string;
  bucket: string;
}): Promise<S3Fake> {
  mkdirSync(directory, { recursive: true });
  const server = new (S3rver as S3rverClass)({
    address: "127.0.0.1",
    port,
    directory,
    silent: true,
    configureBuckets: [{ name: bucket }],
  });
  const address = await server.run();
  return { endpoint: `http://127.0.0.1:${address.port}`, port: address.port, close: () => server.close() };
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const directory = process.env.S3_FAKE_DIR ?? path.resolve(".data/s3");
  const bucket = process.env.S3_BUCKET ?? "sternpost-photos";
  const fake = await startS3Fake({ port: Number(process.env.S3_PORT ?? 4569), directory, bucket });
  console.log(`S3 stand-in on ${fake.endpoint}, bucket "${bucket}", objects in ${directory}`);
  for (const signal of ["SIGTERM", "SIGINT"] as const)
    process.on(signal, () => void fake.close().then(() => process.exit(0)));
}
