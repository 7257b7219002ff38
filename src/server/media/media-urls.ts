import { GetObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';

/** SigV4 presigned URLs cannot outlive seven days (AWS S3 documentation, "Sharing objects with presigned URLs"). */
const MAX_SIGNED_SECONDS = 7 * 24 * 3600;

/**
 * How long a member's media links stay valid: an hour to start, plus the class's own length so a
 * member who pauses and finishes the class in one sitting never meets an expired segment.
 */
export function mediaLinkSeconds(classSeconds: number | null | undefined): number {
  return Math.min(MAX_SIGNED_SECONDS, 3600 + Math.ceil(Math.max(0, classSeconds ?? 0)));
}

/**
 * The one place that turns a storage key into a link a browser fetches media bytes from. Today a
 * presigned GET of the object store; a CDN in front of the bucket would sign its own URLs here
 * (README, "Media delivery"), and nothing else in the app would change.
 */
export function signedMediaUrl(s3: S3Client, bucket: string, key: string, expiresIn: number): Promise<string> {
  return getSignedUrl(s3, new GetObjectCommand({ Bucket: bucket, Key: key }), { expiresIn });
}
