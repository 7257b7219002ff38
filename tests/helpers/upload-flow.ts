import type { ApiClient } from './api-client';

/** The S3 XML answers the browser would read, parsed just enough for tests. */
const tag = (xml: string, name: string) => [...xml.matchAll(new RegExp(`<${name}>([^<]*)</${name}>`, 'g'))].map((m) => m[1]!);

/** Drives the multipart upload exactly as the browser widget does: every S3 request presigned by our API. */
export class SignedUpload {
  uploadId = '';
  constructor(
    private api: ApiClient,
    readonly recordingId: string,
  ) {}

  async sign(req: { method: string; uploadId?: string; partNumber?: number }): Promise<Response> {
    return this.api.post(`/api/recordings/${this.recordingId}/sign`, { key: 'client-proposed/key.mp4', ...req });
  }

  private async signed(req: { method: string; uploadId?: string; partNumber?: number }): Promise<string> {
    const res = await this.sign(req);
    if (res.status !== 200) throw new Error(`sign ${req.method} answered ${res.status}: ${await res.text()}`);
    return (await res.json()).url;
  }

  async create(): Promise<void> {
    const res = await fetch(await this.signed({ method: 'POST' }), { method: 'POST' });
    this.uploadId = tag(await res.text(), 'UploadId')[0]!;
  }

  async putPart(partNumber: number, body: Uint8Array): Promise<string> {
    const url = await this.signed({ method: 'PUT', uploadId: this.uploadId, partNumber });
    const res = await fetch(url, { method: 'PUT', body: body as unknown as BodyInit });
    if (!res.ok) throw new Error(`part ${partNumber}: ${res.status}`);
    return res.headers.get('etag')!;
  }

  async listParts(): Promise<{ status: number; parts: { partNumber: number; etag: string }[] }> {
    const res = await fetch(await this.signed({ method: 'GET', uploadId: this.uploadId }));
    const xml = await res.text();
    const numbers = tag(xml, 'PartNumber').map(Number);
    const etags = tag(xml, 'ETag').map((e) => e.replaceAll('&quot;', '"'));
    return { status: res.status, parts: numbers.map((n, i) => ({ partNumber: n, etag: etags[i]! })) };
  }

  async complete(parts: { partNumber: number; etag: string }[]): Promise<number> {
    const body =
      '<CompleteMultipartUpload>' +
      parts.map((p) => `<Part><PartNumber>${p.partNumber}</PartNumber><ETag>${p.etag}</ETag></Part>`).join('') +
      '</CompleteMultipartUpload>';
    const res = await fetch(await this.signed({ method: 'POST', uploadId: this.uploadId }), { method: 'POST', body });
    return res.status;
  }

  async abort(): Promise<number> {
    return (await fetch(await this.signed({ method: 'DELETE', uploadId: this.uploadId }), { method: 'DELETE' })).status;
  }
}

/** Uploads a whole buffer in parts of `partSize` (the last may be smaller) and reports completion to the API. */
export async function uploadWhole(api: ApiClient, lessonId: string, fileName: string, data: Uint8Array, partSize = 5 * 1024 * 1024, contentType = 'video/mp4') {
  const created = await api.post(`/api/lessons/${lessonId}/recordings`, { fileName, sizeBytes: data.length, contentType });
  if (created.status !== 201) throw new Error(`create answered ${created.status}: ${await created.text()}`);
  const rec = await created.json();
  const up = new SignedUpload(api, rec.id);
  await up.create();
  const parts = [];
  for (let n = 1, at = 0; at < data.length; n++, at += partSize) {
    parts.push({ partNumber: n, etag: await up.putPart(n, data.subarray(at, at + partSize)) });
  }
  await up.complete(parts);
  const done = await api.post(`/api/recordings/${rec.id}/complete`);
  return { recordingId: rec.id as string, complete: await done.json() };
}

/** Polls a recording until it leaves uploading/processing (or the time runs out). */
export interface RecordingState {
  state: string;
  step: string | null;
  progress: number;
}

export async function waitForRecording(
  api: ApiClient,
  recordingId: string,
  timeoutMs = 150_000,
  until = (r: RecordingState) => r.state === 'ready' || r.state === 'failed',
) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await (await api.get(`/api/recordings/${recordingId}`)).json();
    if (until(r)) return r;
    if (Date.now() > deadline) throw new Error(`recording still ${r.state} (${r.step} ${r.progress}%) after ${timeoutMs} ms`);
    await new Promise((res) => setTimeout(res, 250));
  }
}
