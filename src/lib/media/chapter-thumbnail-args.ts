import { withToneMap } from './tone-map';

/** Where in a chapter its thumbnail is taken: 3 s in (past the cut), or the middle of a short one. */
export function thumbnailTime(chapter: { startSeconds: number; endSeconds: number }): number {
  return chapter.startSeconds + Math.min(3, (chapter.endSeconds - chapter.startSeconds) / 2);
}

/** ffmpeg arguments for one chapter thumbnail: 180 px high JPEG, seeking before the input (fast); HDR sources tone-mapped first. */
export function buildChapterThumbnailArgs(options: {
  input: string;
  output: string;
  chapter: { startSeconds: number; endSeconds: number };
  colorTransfer?: string | null;
}): string[] {
  return [
    '-hide_banner', '-nostdin', '-y', '-loglevel', 'error',
    '-ss', thumbnailTime(options.chapter).toFixed(3),
    '-i', options.input,
    '-frames:v', '1',
    '-vf', withToneMap(options.colorTransfer, 'scale=-2:180'),
    '-q:v', '4',
    options.output,
  ];
}
