import { startQueue } from '~/server/queue';
import { queueDemoRecording } from '~/scripts/demo/demo-recording-job';
import { DEMO, signedIn } from './api-client';

/**
 * Publishes the demo class Desk-Break Mobility (invented demo data) by running its demo
 * recording job, as the seed does when demo media is on. Waits for the state, not for a time.
 */
export async function ensureDeskBreakPublished(): Promise<{ id: string; slug: string }> {
  const coach = await signedIn(DEMO.owner);
  const lessons = (await (await coach.get('/api/lessons')).json()).lessons as { id: string; slug: string; state: string }[];
  const desk = lessons.find((l) => l.slug === 'desk-break-mobility')!;
  if (desk.state === 'published') return desk;
  // The seed schedules this class to publish once its demo recording is ready.
  const boss = await startQueue(process.env.DATABASE_URL!);
  await queueDemoRecording(boss, desk.id);
  await boss.stop({ graceful: true, wait: true });
  const deadline = Date.now() + 300_000;
  for (;;) {
    const l = await (await coach.get(`/api/lessons/${desk.id}`)).json();
    if (l.state === 'published') return desk;
    if (Date.now() > deadline) throw new Error('the demo class was not published in 5 minutes');
    await new Promise((r) => setTimeout(r, 2000)); // polling interval for a state, not a wait for time to pass
  }
}
