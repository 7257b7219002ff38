// The coach's upload story through the real app, the real object store, the real worker and
// Chromium: a generated clip goes through the class page's upload widget (S3 multipart, every
// request signed by our API), shows its progress, and becomes ready with its poster.
import { mkdtemp, rm, stat, writeFile } from 'node:fs/promises';
import { execFile } from 'node:child_process';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { ListPartsCommand, S3Client } from '@aws-sdk/client-s3';
import { ApiClient, BASE, DEMO } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { signedInPage } from '../helpers/role-pages';

const run = promisify(execFile);
const MAX_UPLOAD_BYTES = Number(process.env.MAX_UPLOAD_BYTES ?? 8 * 1024 ** 3);
const MiB = 1024 * 1024;
const gb = (bytes: number) => `${(bytes / 1024 ** 3).toFixed(1)} GB`;

let browser: Browser;
let dir: string;
let clip: string; // 12 s, 640x360, about 9 MB: two multipart parts (S3 parts are at least 5 MiB)
let api: ApiClient;

const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT ?? `http://127.0.0.1:${process.env.ROUNDMARK_S3_PORT ?? 4569}`,
  region: process.env.S3_REGION ?? 'us-east-1',
  credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER' },
  forcePathStyle: true,
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
});

interface Recording {
  id: string;
  state: string;
  step: string | null;
  sizeBytes: number;
  isCurrent: boolean;
  durationSeconds: number | null;
  width: number | null;
  height: number | null;
  posterUrl: string | null;
  failureReason: string | null;
}

beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'roundmark-upload-'));
  clip = path.join(dir, 'Morning ladder take 2.mp4');
  // Constant 6 Mbit/s so the small clip still spans two parts.
  await run('ffmpeg', [
    '-hide_banner', '-loglevel', 'error', '-y',
    '-f', 'lavfi', '-i', 'testsrc=size=640x360:rate=30',
    '-f', 'lavfi', '-i', 'sine=frequency=440:sample_rate=48000',
    '-t', '12',
    '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p',
    '-b:v', '6M', '-minrate', '6M', '-maxrate', '6M', '-bufsize', '6M', '-x264-params', 'nal-hrd=cbr',
    '-c:a', 'aac', '-b:a', '96k', '-movflags', '+faststart',
    clip,
  ]);
  browser = await launchBrowser();
  api = new ApiClient();
  const res = await api.signIn(DEMO.coach);
  expect(res.status).toBe(200);
});

afterAll(async () => {
  await browser?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

/** A fresh draft class of the coach's, so each case starts with no recording. */
async function newClass(title: string): Promise<string> {
  const res = await api.post('/api/lessons', { title, advertisedMinutes: 12 });
  expect(res.status).toBe(201);
  return ((await res.json()) as { id: string }).id;
}

async function recordingsOf(lessonId: string): Promise<Recording[]> {
  const res = await api.get(`/api/lessons/${lessonId}/recordings`);
  expect(res.status).toBe(200);
  return ((await res.json()) as { recordings: Recording[] }).recordings;
}

/** Signs in through the form, as a coach would, and opens the class page with the widget hydrated. */
async function openClassPage(lessonId: string): Promise<{ context: BrowserContext; page: Page }> {
  const { context, page } = await signedInPage(browser, DEMO.coach, { viewport: { width: 1200, height: 1000 } });
  await page.waitForURL(BASE() + '/studio/classes');
  await page.goto(`${BASE()}/studio/classes/${lessonId}`);
  await page.getByRole('heading', { name: 'Recording', level: 2 }).waitFor();
  await page.locator('.uppy-Dashboard-input').first().waitFor({ state: 'attached' });
  return { context, page };
}

/** Slows the page's uploads (Chromium's own network emulation) so progress, pause and cancel can be watched. */
async function throttleUploads(context: BrowserContext, page: Page, bytesPerSecond: number) {
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', {
    offline: false,
    latency: 20,
    downloadThroughput: -1,
    uploadThroughput: bytesPerSecond,
  });
  return cdp;
}

describe('uploading a recording on the class page', () => {
  it('uploads a generated clip in parts, shows progress, pauses and resumes, and ends ready with its poster', async () => {
    const lessonId = await newClass('Upload story: morning ladder');
    const { context, page } = await openClassPage(lessonId);
    await page.getByText('No recording yet.').waitFor();
    const signed: string[] = [];
    page.on('request', (req) => {
      if (/\/api\/recordings\/[^/]+\/sign$/.test(new URL(req.url()).pathname)) {
        const body = JSON.parse(req.postData() ?? '{}') as { method: string; partNumber?: number; uploadId?: string };
        signed.push(body.method === 'PUT' ? `PUT part ${body.partNumber}` : body.uploadId ? `${body.method} upload` : `${body.method} create`);
      }
    });
    const cdp = await throttleUploads(context, page, 1.5 * MiB);

    await page.setInputFiles('.uppy-Dashboard-input', clip);
    await page.locator('.uppy-Dashboard-Item').waitFor();
    await page.locator('.uppy-StatusBar-actionBtn--upload').click();

    // Progress: Uppy's status bar, and our panel's bar for this recording with bytes, speed and time left.
    const item = page.locator('[data-recording-id]').first();
    await item.and(page.locator('[data-state="uploading"]')).waitFor({ timeout: 15_000 });
    await item.locator('[data-upload-speed]').waitFor({ timeout: 15_000 });
    await page.screenshot({ path: `${SHOTS}/upload-progress.png`, fullPage: true });
    await expect(item.locator('[data-upload-speed]').textContent()).resolves.toMatch(/^[\d.]+ [KMG]B of 8\.7 MB · [\d.]+ [KMG]B\/s · about \d+:\d\d left$/);
    await expect.poll(async () => Number(await item.getByRole('progressbar').getAttribute('aria-valuenow')), { timeout: 15_000 }).toBeGreaterThan(0);
    await page.locator('.uppy-StatusBar', { hasText: 'Uploading' }).waitFor();

    // Pause, then resume: the resume asks the store which parts it has (a signed GET: ListParts).
    await page.getByRole('button', { name: 'Pause', exact: true }).click();
    await page.locator('.uppy-StatusBar', { hasText: 'Paused' }).waitFor();
    await item.locator('[data-step]', { hasText: 'Paused' }).waitFor();
    await page.screenshot({ path: `${SHOTS}/upload-paused.png`, fullPage: true });
    await page.getByRole('button', { name: 'Resume', exact: true }).click();
    await expect.poll(() => signed.includes('GET upload'), { timeout: 15_000 }).toBe(true);
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

    // The upload finishes in the store, the server takes it over; the worker makes it ready.
    await item.and(page.locator('[data-state="processing"], [data-state="ready"]')).waitFor({ timeout: 60_000 });
    expect(signed[0]).toBe('POST create');
    expect(signed).toContain('PUT part 1');
    expect(signed).toContain('PUT part 2');
    expect(signed.at(-1)).toBe('POST upload'); // CompleteMultipartUpload
    await page.screenshot({ path: `${SHOTS}/upload-processing.png`, fullPage: true });

    await item.and(page.locator('[data-state="ready"]')).waitFor({ timeout: 120_000 });
    const poster = item.locator('img');
    await poster.waitFor();
    await expect.poll(() => poster.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 15_000 }).toBeGreaterThan(0);
    await expect(item.textContent()).resolves.toContain('Used for this class');
    await expect(item.locator('dd').allTextContents()).resolves.toEqual(['0:12', '640 × 360']);
    await expect(item.locator('[data-status-label]').textContent()).resolves.toBe('Ready');
    await page.screenshot({ path: `${SHOTS}/upload-ready.png`, fullPage: true });

    const [rec] = await recordingsOf(lessonId);
    expect(rec).toMatchObject({ state: 'ready', isCurrent: true, width: 640, height: 360 });
    expect(rec!.durationSeconds).toBeCloseTo(12, 0);

    // With a ready recording the page does not load the uploader (a third of its script) until asked.
    const scripts: string[] = [];
    page.on('request', (req) => {
      if (req.resourceType() === 'script') scripts.push(new URL(req.url()).pathname);
    });
    await page.reload();
    const another = page.getByRole('button', { name: 'Upload another recording' });
    await another.waitFor();
    await item.and(page.locator('[data-state="ready"]')).waitFor();
    expect(await page.locator('.uppy-Dashboard').count()).toBe(0);
    expect(scripts.filter((s) => s.includes('UploadDropZone'))).toEqual([]);
    await another.click();
    await page.locator('.uppy-Dashboard-input').first().waitFor({ state: 'attached' });
    expect(scripts.filter((s) => s.includes('UploadDropZone')).length).toBe(1);
    await context.close();
  });

  it('refuses a text file in the browser with a message that says what to upload', async () => {
    const lessonId = await newClass('Upload story: wrong file');
    const notes = path.join(dir, 'class notes.txt');
    await writeFile(notes, 'Warm-up 4 min, then five stations.\n');
    const { context, page } = await openClassPage(lessonId);
    const requests: string[] = [];
    page.on('request', (req) => {
      if (req.method() !== 'GET') requests.push(req.url());
    });

    await page.setInputFiles('.uppy-Dashboard-input', notes);
    const problem = page.locator('[data-upload-problem]');
    await problem.waitFor();
    await expect(problem.textContent()).resolves.toBe(
      'Roundmark takes video files in MP4, MOV, WebM or MKV. "class notes.txt" is not one of those: export the recording as MP4 and upload that.',
    );
    expect(await page.locator('.uppy-Dashboard-Item').count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/upload-wrong-type.png`, fullPage: true });
    expect(requests).toEqual([]); // nothing was announced or sent
    expect(await recordingsOf(lessonId)).toEqual([]);
    await context.close();
  });

  it('refuses a file over the size limit in the browser, and the server refuses it too (413)', async () => {
    const lessonId = await newClass('Upload story: too large');
    // A sparse file: the browser sees its size without the disk holding it.
    const big = path.join(dir, 'Full day workshop.mov');
    await run('truncate', ['-s', String(MAX_UPLOAD_BYTES + 1024 * MiB), big]);
    const { context, page } = await openClassPage(lessonId);

    await page.setInputFiles('.uppy-Dashboard-input', big);
    const problem = page.locator('[data-upload-problem]');
    await problem.waitFor();
    await expect(problem.textContent()).resolves.toBe(
      `This file is ${gb(MAX_UPLOAD_BYTES + 1024 * MiB)}; the largest recording Roundmark takes is ${gb(MAX_UPLOAD_BYTES)}. Export at a lower bitrate and upload again.`,
    );
    expect(await page.locator('.uppy-Dashboard-Item').count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/upload-too-large.png`, fullPage: true });
    await context.close();

    // The server does not trust the browser: the same announcement answers 413.
    const res = await api.post(`/api/lessons/${lessonId}/recordings`, {
      fileName: 'Full day workshop.mov',
      sizeBytes: MAX_UPLOAD_BYTES + MiB,
      contentType: 'video/quicktime',
    });
    expect(res.status).toBe(413);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('too_large');
    expect(body.error.message).toContain('Export at a lower bitrate');
    expect(await recordingsOf(lessonId)).toEqual([]);
  });

  it('after a dropped connection, the upload carries on from the parts the store already has', async () => {
    const lessonId = await newClass('Upload story: dropped connection');
    const { context, page } = await openClassPage(lessonId);
    const signed: string[] = [];
    const partsSent: number[] = []; // part uploads that left the browser for the store
    page.on('request', (req) => {
      const url = new URL(req.url());
      if (/\/api\/recordings\/[^/]+\/sign$/.test(url.pathname)) {
        const body = JSON.parse(req.postData() ?? '{}') as { method: string; partNumber?: number; uploadId?: string };
        signed.push(body.method === 'PUT' ? `PUT part ${body.partNumber}` : body.uploadId ? `${body.method} upload` : `${body.method} create`);
      }
      if (req.method() === 'PUT' && url.searchParams.has('partNumber')) partsSent.push(Number(url.searchParams.get('partNumber')));
    });
    // Holds the store's answer to part 1 in the browser: the store has the part, the page does not
    // know yet, and the connection drops before the answer gets through. Holding the answer, rather
    // than racing the drop against the parts, fixes the order: the page has to ask the store.
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Fetch.enable', { patterns: [{ urlPattern: '*partNumber=1*', requestStage: 'Response' }] });
    const part1Answer = new Promise<{ requestId: string; status: number | undefined }>((resolve) => {
      cdp.on('Fetch.requestPaused', (e) => {
        // The browser's CORS preflight (OPTIONS) for the part goes through at once.
        if (e.request.method === 'PUT') resolve({ requestId: e.requestId, status: e.responseStatusCode });
        else void cdp.send('Fetch.continueResponse', { requestId: e.requestId });
      });
    });

    await page.setInputFiles('.uppy-Dashboard-input', clip);
    await page.locator('.uppy-StatusBar-actionBtn--upload').click();
    const held = await part1Answer;
    expect(held.status).toBe(200); // the store has part 1
    await cdp.send('Network.emulateNetworkConditions', { offline: true, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    await page.locator('[data-upload-problem]', { hasText: 'The connection dropped.' }).waitFor({ timeout: 30_000 });
    const item = page.locator('[data-recording-id]').first();
    await item.locator('[data-step]', { hasText: 'Stopped: carries on from the last finished part' }).waitFor();
    await page.screenshot({ path: `${SHOTS}/upload-offline.png`, fullPage: true });
    // Let the held answer go (the page may have given up on that request, leaving nothing to answer).
    await cdp.send('Fetch.continueResponse', { requestId: held.requestId }).catch(() => {});
    await cdp.send('Fetch.disable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

    await item.and(page.locator('[data-state="processing"], [data-state="ready"]')).waitFor({ timeout: 60_000 });
    // Back online, the page asked the store which parts it has (ListParts) and sent only part 2.
    const listed = signed.indexOf('GET upload');
    expect(listed).toBeGreaterThan(signed.indexOf('PUT part 1'));
    expect(signed.indexOf('PUT part 2')).toBeGreaterThan(listed);
    expect(signed.filter((s) => s === 'PUT part 1')).toHaveLength(1);
    expect(partsSent).toEqual([1, 2]);
    expect(signed.at(-1)).toBe('POST upload'); // CompleteMultipartUpload
    expect(await page.locator('[data-upload-problem]').count()).toBe(0);
    // The server measured what arrived in the store: the whole file.
    const [rec] = await recordingsOf(lessonId);
    expect(rec!.sizeBytes).toBe((await stat(clip)).size);
    await context.close();
  });

  it('cancelling mid-upload aborts the multipart upload in the store', async () => {
    const lessonId = await newClass('Upload story: cancelled');
    const { context, page } = await openClassPage(lessonId);
    await throttleUploads(context, page, 1 * MiB);
    const storeCalls: { method: string; url: string; status?: number }[] = [];
    page.on('response', (res) => {
      const url = new URL(res.url());
      if (url.searchParams.has('uploadId')) storeCalls.push({ method: res.request().method(), url: res.url(), status: res.status() });
    });

    await page.setInputFiles('.uppy-Dashboard-input', clip);
    await page.locator('.uppy-StatusBar-actionBtn--upload').click();
    // Wait until the first part is stored, so there is something to clean up.
    await expect.poll(() => storeCalls.some((c) => c.method === 'PUT' && c.status === 200), { timeout: 30_000 }).toBe(true);
    await page.locator('.uppy-StatusBar').getByRole('button', { name: 'Cancel', exact: true }).click();
    await expect.poll(() => storeCalls.find((c) => c.method === 'DELETE')?.status, { timeout: 15_000 }).toBe(204);
    expect(await page.locator('.uppy-Dashboard-Item').count()).toBe(0);

    // The store no longer knows the upload: its parts are gone.
    const abort = new URL(storeCalls.find((c) => c.method === 'DELETE')!.url);
    const [, bucket, ...keyParts] = decodeURIComponent(abort.pathname).split('/');
    const err = await s3
      .send(new ListPartsCommand({ Bucket: bucket!, Key: keyParts.join('/'), UploadId: abort.searchParams.get('uploadId')! }))
      .then(() => null, (e: { name?: string }) => e);
    expect(err?.name).toBe('NoSuchUpload');
    // The widget told the server at once: the recording shows as cancelled, not as a stalled upload.
    await page.locator('[data-recording-id][data-state="cancelled"]', { hasText: 'You cancelled this upload' }).first().waitFor();
    await page.screenshot({ path: `${SHOTS}/upload-cancelled.png`, fullPage: true });
    await context.close();
  });
});
