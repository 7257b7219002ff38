import type { APIRoute } from 'astro';
import { timelineExportQuery } from '~/lib/api/timeline-file-schemas';
import { timelineToCsv } from '~/lib/timeline/timeline-csv';
import { timelineToWebVtt } from '~/lib/timeline/timeline-webvtt';
import { app } from '~/server/app';
import { AppError } from '~/server/errors';
import { endpoint, parseWith } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { getLesson } from '~/server/services/lessons';
import { getTimeline } from '~/server/services/timelines';

export const GET: APIRoute = endpoint(async ({ locals, params, url }) => {
  const { studio } = requireCan(locals, 'class.view');
  const { format } = parseWith(timelineExportQuery, Object.fromEntries(url.searchParams));
  const lesson = await getLesson(app(), studio.studioId, params.id!);
  const timeline = await getTimeline(app(), studio.studioId, params.id!);
  let body: string;
  if (format === 'csv') body = timelineToCsv(timeline);
  else {
    const vtt = timelineToWebVtt(timeline, { includeCues: true });
    if (!vtt.ok) {
      throw new AppError('conflict', `This timeline cannot be written as WebVTT yet: ${vtt.errors[0]!.message}`, undefined, {
        errors: vtt.errors,
      });
    }
    body = vtt.text;
  }
  return new Response(body, {
    headers: {
      'content-type': format === 'csv' ? 'text/csv; charset=utf-8' : 'text/vtt; charset=utf-8',
      'content-disposition': `attachment; filename="${lesson.slug}-timeline.${format}"`,
      'cache-control': 'no-store',
    },
  });
});
