import { HeadBucketCommand, S3Client } from '@aws-sdk/client-s3';
import { env } from './env';
import { isConnectionFailure, storeUnavailable } from './unavailable';

export interface StorageConfig {
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
}

/** Storage settings from the environment; any S3-compatible store works by changing them. */
export function storageConfigFromEnv(): StorageConfig {
  const e = env();
  return {
    endpoint: e.S3_ENDPOINT,
    region: e.S3_REGION,
    bucket: e.S3_BUCKET,
    accessKeyId: e.S3_ACCESS_KEY_ID,
    secretAccessKey: e.S3_SECRET_ACCESS_KEY,
    forcePathStyle: e.S3_FORCE_PATH_STYLE,
  };
}

/**
 * An S3 client. Checksums only when required: otherwise the current SDK frames streamed bodies
 * and adds checksum parameters to presigned URLs, which not every S3-compatible store accepts.
 */
export function createS3(config: StorageConfig): S3Client {
  const client = new S3Client({
    ...(config.endpoint ? { endpoint: config.endpoint } : {}),
    region: config.region,
    forcePathStyle: config.forcePathStyle,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  // After the SDK's own retries, a store that cannot be reached is a domain error (503 "try again"),
  // not an unknown one (500); the worker's jobs fail with the same words and are retried.
  client.middlewareStack.add(
    (next) => async (args) => {
      try {
        return await next(args);
      } catch (err) {
        if (isConnectionFailure(err)) throw storeUnavailable();
        throw err;
      }
    },
    { step: 'initialize', name: 'storeUnavailable' },
  );
  return client;
}

let shared: { s3: S3Client; bucket: string } | undefined;

/** The process-wide storage client. */
export function storage() {
  if (!shared) {
    const config = storageConfigFromEnv();
    shared = { s3: createS3(config), bucket: config.bucket };
  }
  return shared;
}

/** True when the bucket answers. */
export async function storageReachable(s3: S3Client, bucket: string): Promise<boolean> {
  try {
    await s3.send(new HeadBucketCommand({ Bucket: bucket }), { abortSignal: AbortSignal.timeout(3000) });
    return true;
  } catch {
    return false;
  }
}
