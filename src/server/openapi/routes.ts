import type { RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { errors, json } from './responses';
import { coverChoiceInput, coverFrameInput, coverFrameOutput, coverOutput } from '~/lib/api/cover-schemas';
import { planPutSchema } from '~/lib/plan/plan-schema';
import { timelinePutSchema } from '~/lib/timeline/timeline-schema';
import { timelineExportQuery, timelineFileText, timelineImportQuery } from '~/lib/api/timeline-file-schemas';
import { timelineImportErrorOutput } from '~/lib/api/error-schemas';
import { coverFrameParams, exerciseIdParams, lessonIdParams as params, recordingIdParams as recordingParams } from '~/lib/api/route-params';
import {
  createExerciseInput,
  exerciseListOutput,
  exerciseOutput,
  exerciseUsageOutput,
  mergeExercisesInput,
  mergeExercisesOutput,
  updateExerciseInput,
} from '~/lib/api/exercise-schemas';
import { createPlanTemplateInput, planTemplateListOutput, planTemplateOutput } from '~/lib/api/plan-template-schemas';
import { checkResultOutput, planViewOutput, timelineImportOutput, timelineOutput, timelineSavedOutput } from '~/lib/api/timeline-schemas';
import { createRecordingInput, recordingListOutput, recordingOutput, signedRequestOutput, signUploadInput } from '~/lib/api/recording-schemas';
import {
  archivedOutput,
  progressInput,
  progressOutput,
  progressRecordedOutput,
  publishedOutput,
  publishInput,
  scheduledOutput,
  unpublishedOutput,
  versionListOutput,
} from '~/lib/api/publish-schemas';
import { cautionOutput } from '~/lib/api/auth-schemas';
import { readyForReviewInput, reviewRequestOutput, sendBackInput, sentBackOutput } from '~/lib/api/review-schemas';

/** Routes of the plan, timeline, check, exercise, recording, publishing and playback features. */
export const apiRoutes: RouteConfig[] = [
  {
    method: 'put', path: '/api/lessons/{id}/review', summary: 'Mark the class ready for review with an optional note (staff); its coaches and owner are e-mailed. A later hand-off replaces the earlier one',
    request: { params, body: json(readyForReviewInput, 'The hand-off') },
    responses: { 200: json(reviewRequestOutput, 'Waiting for review'), ...errors(400, 401, 403, 404, 409) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/review/send-back', summary: 'Send a class that waits for review back to whoever prepared it, with a note (coach, owner); publishing also ends the wait',
    request: { params, body: json(sendBackInput, 'What needs another look') },
    responses: { 200: json(sentBackOutput, 'Sent back'), ...errors(400, 401, 403, 404, 409) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/publish', summary: 'Publish a new immutable version (coach, owner); errors block, warnings need acknowledgeWarnings; publishAt schedules (owner)',
    request: { params, body: json(publishInput, 'Publish options') },
    responses: {
      201: json(publishedOutput, 'Published'),
      202: json(scheduledOutput, 'Scheduled'),
      ...errors(400, 401, 403, 404, 409),
    },
  },
  {
    method: 'post', path: '/api/lessons/{id}/unpublish', summary: 'Take the class out of the library (versions are kept)', request: { params },
    responses: { 200: json(unpublishedOutput, 'Unpublished'), ...errors(401, 403, 404) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/archive', summary: 'Archive the class (versions are kept)', request: { params },
    responses: { 200: json(archivedOutput, 'Archived'), ...errors(401, 403, 404) },
  },
  {
    method: 'get', path: '/api/lessons/{id}/versions', summary: 'Published versions, newest first', request: { params },
    responses: {
      200: json(versionListOutput, 'Versions'),
      ...errors(401, 403, 404),
    },
  },
  {
    method: 'get', path: '/api/lessons/{id}/progress', summary: 'Where the member stopped in a class', request: { params },
    responses: { 200: json(progressOutput, 'Progress'), ...errors(401, 404) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/progress', summary: 'Report playback (position, watched spans, event); finishing is decided here',
    request: { params, body: json(progressInput, 'Playback report') },
    responses: {
      200: json(progressRecordedOutput, 'Recorded'),
      ...errors(400, 401, 403, 404),
    },
  },
  {
    method: 'post', path: '/api/me/caution', summary: 'Record that the member read the general exercise caution',
    responses: { 200: json(cautionOutput, 'Recorded'), ...errors(401) },
  },
  {
    method: 'get', path: '/api/lessons/{id}/recordings', summary: 'Recordings of a class, newest first', request: { params },
    responses: { 200: json(recordingListOutput, 'Recordings'), ...errors(401, 403, 404) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/recordings', summary: 'Announce an upload; the server checks type and size and chooses the storage key',
    request: { params, body: json(createRecordingInput, 'The file to upload') },
    responses: { 201: json(recordingOutput, 'Ready to upload'), ...errors(400, 401, 403, 404, 413) },
  },
  {
    method: 'get', path: '/api/recordings/{id}', summary: 'State, step and progress of a recording', request: { params: recordingParams },
    responses: { 200: json(recordingOutput, 'Recording'), ...errors(401, 403, 404) },
  },
  {
    method: 'post', path: '/api/recordings/{id}/sign', summary: 'Presign one S3 request of the multipart upload (create, part, list parts, complete, abort)',
    request: { params: recordingParams, body: json(signUploadInput, 'The S3 request to sign') },
    responses: { 200: json(signedRequestOutput, 'Presigned URL for the recording’s own key'), ...errors(400, 401, 403, 404, 409, 413) },
  },
  {
    method: 'post', path: '/api/recordings/{id}/complete', summary: 'Report that the store completed the upload; processing starts', request: { params: recordingParams },
    responses: { 200: json(recordingOutput, 'Recording'), ...errors(401, 403, 404, 409) },
  },
  {
    method: 'post', path: '/api/recordings/{id}/cancel', summary: 'Cancel an unfinished upload (the store drops its parts)', request: { params: recordingParams },
    responses: { 200: json(recordingOutput, 'Recording'), ...errors(401, 403, 404) },
  },
  {
    method: 'post', path: '/api/recordings/{id}/retry', summary: 'Process a failed recording again', request: { params: recordingParams },
    responses: { 200: json(recordingOutput, 'Recording'), ...errors(401, 403, 404, 409) },
  },
  {
    method: 'get', path: '/api/lessons/{id}/plan', summary: 'The class plan with its expected schedule and totals', request: { params },
    responses: { 200: json(planViewOutput, 'Plan (null before one is written)'), ...errors(401, 403, 404) },
  },
  {
    method: 'put', path: '/api/lessons/{id}/plan', summary: 'Write the class plan (exercise names new to the studio are added to its list)',
    request: { params, body: json(planPutSchema, 'The plan and the class version it was read at') },
    responses: { 200: json(planViewOutput, 'Stored'), ...errors(400, 401, 403, 404, 409) },
  },
  {
    method: 'get', path: '/api/lessons/{id}/timeline', summary: 'The draft timeline (version 0 before the first save)', request: { params },
    responses: { 200: json(timelineOutput, 'Timeline'), ...errors(401, 403, 404) },
  },
  {
    method: 'put', path: '/api/lessons/{id}/timeline', summary: 'Replace the timeline in one transaction; a stale version answers 409',
    request: { params, body: json(timelinePutSchema, 'Whole timeline') },
    responses: { 200: json(timelineSavedOutput, 'Saved'), ...errors(400, 401, 403, 404, 409) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/check', summary: 'Run the timing check on the stored plan and timeline', request: { params },
    responses: { 200: json(checkResultOutput, 'Check result'), ...errors(401, 403, 404, 409) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/timeline/import', summary: 'Replace the timeline with a CSV or WebVTT chapters file; a bad file imports nothing',
    request: {
      params,
      query: timelineImportQuery,
      body: { description: 'CSV (header row) or WebVTT', content: { 'text/csv': { schema: timelineFileText }, 'text/vtt': { schema: timelineFileText } } },
    },
    responses: {
      200: json(timelineImportOutput, 'Imported'),
      400: json(timelineImportErrorOutput, 'Invalid input, or problems by line (`errors`); nothing imported'),
      ...errors(401, 403, 404, 409, 413),
    },
  },
  {
    method: 'get', path: '/api/lessons/{id}/timeline/export', summary: 'Download the timeline as CSV or a WebVTT chapters file',
    request: { params, query: timelineExportQuery },
    responses: {
      200: { description: 'The file', content: { 'text/csv': { schema: timelineFileText }, 'text/vtt': { schema: timelineFileText } } },
      ...errors(400, 401, 403, 404, 409),
    },
  },
  {
    method: 'get', path: '/api/lessons/{id}/cover', summary: 'The class’s cover and the chapter thumbnails it can choose from', request: { params },
    responses: { 200: json(coverOutput, 'Cover'), ...errors(401, 403, 404) },
  },
  {
    method: 'put', path: '/api/lessons/{id}/cover', summary: 'Choose a chapter thumbnail as the cover, or go back to the first work chapter’s',
    request: { params, body: json(coverChoiceInput, 'Where the cover comes from') },
    responses: { 200: json(coverOutput, 'Chosen'), ...errors(400, 401, 403, 404, 409) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/cover/upload', summary: 'Upload a JPEG or PNG picture (at most 5 MiB; the bytes decide what it is) as the cover; it is cropped to 1280 × 720',
    request: {
      params,
      body: { description: 'The picture’s bytes', content: { 'image/jpeg': { schema: z.string().describe('binary') }, 'image/png': { schema: z.string().describe('binary') } } },
    },
    responses: { 200: json(coverOutput, 'Stored'), ...errors(400, 401, 403, 404, 409, 413, 415) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/cover/frame', summary: 'Use the frame at a moment of the current recording as the cover: the worker takes it (1280 × 720 JPEG) and switches the cover when done',
    request: { params, body: json(coverFrameInput, 'The moment, in seconds from the recording’s start') },
    responses: { 202: json(coverFrameOutput, 'Queued'), ...errors(400, 401, 403, 404, 409) },
  },
  {
    method: 'get', path: '/api/lessons/{id}/cover/frame/{frameId}', summary: 'How far a frame-as-cover request got',
    request: { params: coverFrameParams },
    responses: { 200: json(coverFrameOutput, 'The request'), ...errors(401, 403, 404) },
  },
  {
    method: 'get', path: '/api/exercises', summary: 'The studio’s exercise list',
    responses: { 200: json(exerciseListOutput, 'Exercises'), ...errors(401, 403) },
  },
  {
    method: 'post', path: '/api/exercises', summary: 'Add an exercise', request: { body: json(createExerciseInput, 'Exercise') },
    responses: { 201: json(exerciseOutput, 'Added'), ...errors(400, 401, 403, 409) },
  },
  {
    method: 'patch', path: '/api/exercises', summary: 'Change an exercise (by id in the body)', request: { body: json(updateExerciseInput, 'Changes') },
    responses: { 200: json(exerciseOutput, 'Changed'), ...errors(400, 401, 403, 404, 409) },
  },
  {
    method: 'get', path: '/api/exercises/{id}/usage', summary: 'Classes and studio templates that name this exercise (shown before a merge)',
    request: { params: exerciseIdParams },
    responses: { 200: json(exerciseUsageOutput, 'Where it is named'), ...errors(401, 403, 404) },
  },
  {
    method: 'post', path: '/api/exercises/merge', summary: 'Merge one exercise name into another: plans, marks and templates that named it follow, in one transaction',
    request: { body: json(mergeExercisesInput, 'The name to merge away and the one to keep') },
    responses: { 200: json(mergeExercisesOutput, 'Merged'), ...errors(400, 401, 403, 404) },
  },
  {
    method: 'get', path: '/api/plan-templates', summary: 'Plan templates: the built-in formats, then the studio’s own',
    responses: { 200: json(planTemplateListOutput, 'Templates'), ...errors(401, 403) },
  },
  {
    method: 'post', path: '/api/plan-templates', summary: 'Save a plan as a studio template', request: { body: json(createPlanTemplateInput, 'Name and plan') },
    responses: { 201: json(planTemplateOutput, 'Saved'), ...errors(400, 401, 403, 409) },
  },
];
