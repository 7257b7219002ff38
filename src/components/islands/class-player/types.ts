import type { Chapter } from '~/lib/publishing/chapters';
import type { Segment } from '~/lib/timeline/timeline-schema';

/** Per-exercise notes the studio wrote, shown when that exercise is on. */
export interface ExerciseNote {
  name: string;
  cautions: string | null;
  easierOption: string | null;
  harderOption: string | null;
}

/** Everything the player needs, computed by the class page on the server. */
export interface PlayerProps {
  lessonId: string;
  title: string;
  playlistUrl: string;
  posterUrl: string;
  chaptersUrl: string;
  thumbnailBase: string;
  durationSeconds: number;
  chapters: Chapter[];
  segments: Segment[];
  exercises: ExerciseNote[];
  resumeAt: number;
  finished: boolean;
  cautionAcknowledged: boolean;
  /** The published version's captions track, when it has captions. */
  captions: { url: string; language: string; label: string } | null;
  /** Whether the member last turned captions on (remembered with their account). */
  captionsOn: boolean;
}
