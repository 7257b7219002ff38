import type { CaptionsPut } from '~/lib/captions/caption-schema';
import type { AppDeps } from '../app';
import { putCaptions, putCaptionsPreference } from '../services/captions';
import { assertCan, type Actor } from './actor';

/**
 * Replaces a class's captions (staff) when `version` is current. The editor's list, a caption
 * file upload and "Remove all captions" (an empty list) all land here.
 */
export async function saveClassCaptions(actor: Actor, deps: AppDeps, input: CaptionsPut & { lessonId: string }): Promise<{ version: number; cues: number }> {
  assertCan(actor, 'class.edit');
  const { lessonId, ...captions } = input;
  return putCaptions(deps, actor.studioId, lessonId, captions);
}

/** The member's captions on/off choice, remembered with their account (any signed-in person). */
export async function rememberCaptionsChoice(userId: string, deps: AppDeps, captionsOn: boolean): Promise<{ captionsOn: boolean }> {
  await putCaptionsPreference(deps, userId, captionsOn);
  return { captionsOn };
}
