/**
 * The staff class page on the server: no browser-only code runs while it renders, and the
 * publishing panel tells a coach to wait (not to upload) while a recording is on its way.
 */
import { readFileSync, statSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DEMO, signedIn } from '../helpers/api-client';

const LOG = 'test-results/app.log'; // where tests/helpers/app-server.ts sends the app's output

describe('the staff class page', () => {
  it('renders without running the upload widget’s IndexedDB restore on the server', async () => {
    const coach = await signedIn(DEMO.coach);
    const lesson = await (await coach.post('/api/lessons', { title: `Render check ${Date.now()}`, advertisedMinutes: 10 })).json();
    const from = statSync(LOG).size;
    for (let i = 0; i < 3; i++) expect((await coach.get(`/studio/classes/${lesson.id}`)).status).toBe(200);
    const logged = readFileSync(LOG, 'utf8').slice(from);
    expect(logged).not.toMatch(/indexedDB/i);
  });

  it('says to wait while a recording is uploading or processing, not to upload one', async () => {
    const coach = await signedIn(DEMO.coach);
    const lesson = await (await coach.post('/api/lessons', { title: `Waiting panel ${Date.now()}`, advertisedMinutes: 10 })).json();
    let html = await (await coach.get(`/studio/classes/${lesson.id}`)).text();
    expect(html).toContain('Upload the recording and wait until it is ready.');
    const announced = await coach.post(`/api/lessons/${lesson.id}/recordings`, { fileName: 'class.mp4', sizeBytes: 1_000_000, contentType: 'video/mp4' });
    expect(announced.status).toBe(201);
    html = await (await coach.get(`/studio/classes/${lesson.id}`)).text();
    expect(html).toContain('Wait for the recording to finish uploading and processing');
    expect(html).not.toContain('Upload the recording and wait until it is ready.');
  });
});

describe('a class page that is not there', () => {
  it('answers 404 with the product’s page and a way back, for members and staff', async () => {
    const member = await signedIn(DEMO.member);
    const res = await member.get('/s/fernhill/classes/no-such-class-here');
    expect(res.status).toBe(404);
    const html = await res.text();
    expect(html).toContain("We can't find that page");
    expect(html).toContain('href="/library"');
    const coach = await signedIn(DEMO.coach);
    const staff = await coach.get('/studio/classes/00000000-0000-4000-8000-000000000000');
    expect(staff.status).toBe(404);
    expect(await staff.text()).toContain('href="/studio"');
  });
});
