import { uploadedCoverPath } from './cover';

/** A frame-as-cover request waits for the worker, is being taken, became the cover, or failed. */
export const COVER_FRAME_STATES = ['waiting', 'working', 'done', 'failed'] as const;
export type CoverFrameState = (typeof COVER_FRAME_STATES)[number];

/** The picture a frame request makes: fixed by the request's id, so a retry overwrites it. */
export const coverFramePath = (frameId: string) => uploadedCoverPath(frameId);

/**
 * Whether a moment lies inside a recording of this length: from its start up to, not including,
 * its end (the last frame starts before the end; a time at the end has no frame to show).
 */
export const isInsideRecording = (atSeconds: number, durationSeconds: number) => atSeconds >= 0 && atSeconds < durationSeconds;
