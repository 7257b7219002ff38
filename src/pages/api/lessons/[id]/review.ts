import type { APIRoute } from 'astro';
import { readyForReviewInput, reviewRequestOutput } from '~/lib/api/review-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { markReadyForReview } from '~/server/use-cases/review-hand-off';

/** Marks the class ready for review with an optional note (staff); coaches and the owner are e-mailed. */
export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const input = await readJson(request, readyForReviewInput);
  const review = await markReadyForReview(actor, app(), { lessonId: params.id!, ...input });
  return answer(reviewRequestOutput, { ...review, requestedAt: review.requestedAt.toISOString() });
});
