import type { APIRoute } from 'astro';
import { captionsImportQuery, captionsSavedOutput, MAX_CAPTION_FILE_BYTES } from '~/lib/captions/caption-schema';
import { captionsFromFile } from '~/lib/captions/captions-vtt';
import { app } from '~/server/app';
import { AppError } from '~/server/errors';
import { answer, endpoint, parseWith, readBodyText } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { saveClassCaptions } from '~/server/use-cases/class-captions';

/** Replaces the captions with an uploaded WebVTT or SubRip file; a bad file stores nothing. */
export const POST: APIRoute = endpoint(async ({ locals, params, request, url }) => {
  const actor = requireActor(locals);
  const query = parseWith(captionsImportQuery, Object.fromEntries(url.searchParams));
  const read = captionsFromFile(await readBodyText(request, MAX_CAPTION_FILE_BYTES));
  if (!read.ok) throw new AppError('invalid_input', read.message, { file: read.message });
  return answer(captionsSavedOutput, await saveClassCaptions(actor, app(), { lessonId: params.id!, ...query, cues: read.cues }));
});
