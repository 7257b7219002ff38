import { publishDueClasses } from '../use-cases/publish-class';
import type { JobHandler } from './job-context';

/** Publishes classes whose scheduled time has come (see publishDueClasses). */
export const publishDue: JobHandler<'lessons.publish-due'> = async (_data, ctx) => {
  const { published, waiting } = await publishDueClasses(ctx.deps);
  const any = published.length + waiting.length > 0;
  return { outcome: any ? 'done' : 'skipped', detail: `${published.length} published, ${waiting.length} waiting${waiting.length ? ` (${waiting.join('; ')})` : ''}` };
};
