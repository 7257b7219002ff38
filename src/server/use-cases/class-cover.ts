import type { CoverChoiceInput, CoverFrameInput, CoverFrameOutput, CoverOutput } from '~/lib/api/cover-schemas';
import type { AppDeps } from '../app';
import type { S3Client } from '@aws-sdk/client-s3';
import { chooseCover, uploadCover } from '../services/lesson-cover';
import { requestCoverFrame } from '../services/cover-frames';
import { assertCan, type Actor } from './actor';

/** Chooses a chapter's thumbnail as the class's cover, or goes back to the default (staff). */
export async function chooseClassCover(actor: Actor, deps: AppDeps, input: { lessonId: string; choice: CoverChoiceInput }): Promise<CoverOutput> {
  assertCan(actor, 'class.edit');
  return chooseCover(deps, actor.studioId, input.lessonId, input.choice);
}

/** Uploads a JPEG or PNG picture as the class's cover (staff). */
export async function uploadClassCover(
  actor: Actor,
  deps: AppDeps,
  storage: { s3: S3Client; bucket: string },
  input: { lessonId: string; bytes: Uint8Array },
): Promise<CoverOutput> {
  assertCan(actor, 'class.edit');
  return uploadCover(deps, storage, actor.studioId, input.lessonId, input.bytes);
}

/** Asks the worker for a cover picture from the moment of the recording staff paused at (staff). */
export async function coverFromFrame(actor: Actor, deps: AppDeps, input: { lessonId: string; frame: CoverFrameInput }): Promise<CoverFrameOutput> {
  assertCan(actor, 'class.edit');
  return requestCoverFrame(deps, actor.studioId, input.lessonId, input.frame, actor.userId);
}
