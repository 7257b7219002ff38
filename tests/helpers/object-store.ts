import { createS3 } from '~/server/storage';

/** The test run's own S3 client for the local object store (to look at or remove what the app stored). */
export const testS3 = () =>
  createS3({
    endpoint: process.env.S3_ENDPOINT!,
    region: process.env.S3_REGION!,
    bucket: process.env.S3_BUCKET!,
    accessKeyId: process.env.S3_ACCESS_KEY_ID!,
    secretAccessKey: process.env.S3_SECRET_ACCESS_KEY!,
    forcePathStyle: true,
  });
export const testBucket = () => process.env.S3_BUCKET!;
