/**
 * Object storage for uploads through the AWS S3 SDK: any S3-compatible service, in development
 * and tests the local fake that `npm start`/`npm test` run (path-style addressing).
 */
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";

declare global {
  var __fallwrightS3: S3Client | undefined;
}

function client(): S3Client {
  if (!globalThis.__fallwrightS3) {
    const endpoint = process.env.S3_ENDPOINT;
    if (!endpoint) throw new Error("S3_ENDPOINT is not set");
    globalThis.__fallwrightS3 = new S3Client({
      endpoint,
      region: process.env.S3_REGION ?? "us-east-1",
      forcePathStyle: true,
      credentials: {
        accessKeyId: process.env.S3_ACCESS_KEY_ID ?? "",
        secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? "",
      },
    });
  }
  return globalThis.__fallwrightS3;
}

const bucket = () => process.env.S3_BUCKET ?? "fallwright";

export async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
  await client().send(
    new PutObjectCommand({
      Bucket: bucket(),
      Key: key,
      Body: body,
      ContentType: contentType,
      ContentLength: body.byteLength,
    }),
  );
}

/** The object as a web stream, or null when the store has no such key. */
export async function getObjectStream(key: string): Promise<{ body: ReadableStream; length?: number } | null> {
  try {
    const out = await client().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    if (!out.Body) return null;
    return { body: out.Body.transformToWebStream(), length: out.ContentLength };
  } catch (error) {
    const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
    if (e.name === "NoSuchKey" || e.$metadata?.httpStatusCode === 404) return null;
    throw error;
  }
}

export async function deleteObject(key: string): Promise<void> {
  await client().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}
