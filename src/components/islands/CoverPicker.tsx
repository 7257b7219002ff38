import { useEffect, useId, useState } from 'react';
import type { CoverOutput } from '~/lib/api/cover-schemas';
import { MAX_COVER_UPLOAD_BYTES } from '~/lib/publishing/cover';
import { ApiError, apiCall } from './api-client';
import { smallButton } from './plan-builder/fields';
import CoverFromFrame from './CoverFromFrame';

/**
 * The class's cover: the current picture, any chapter thumbnail of the published version to choose
 * from, the frame where the editor's video is paused (made by the worker), back to the default (the first work chapter's), or a JPEG/PNG upload. The server checks the
 * upload's bytes; the size limit is also checked here so a huge photo is not sent for nothing.
 */
export default function CoverPicker({ lessonId }: { lessonId: string }) {
  const id = useId();
  const [cover, setCover] = useState<CoverOutput | null>(null);
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const path = `/api/lessons/${lessonId}/cover`;

  useEffect(() => {
    apiCall<CoverOutput>('GET', path)
      .then(setCover)
      .catch((err: unknown) => setMessage({ tone: 'error', text: err instanceof ApiError ? err.message : 'The cover could not be loaded.' }));
  }, [path]);

  async function run(call: () => Promise<CoverOutput>, done: string) {
    setBusy(true);
    setMessage(null);
    try {
      setCover(await call());
      setMessage({ tone: 'ok', text: done });
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      setMessage({ tone: 'error', text: err.message });
    } finally {
      setBusy(false);
    }
  }

  function upload(file: File | undefined) {
    if (!file) return;
    if (file.size > MAX_COVER_UPLOAD_BYTES) {
      setMessage({ tone: 'error', text: `That picture is ${(file.size / 1024 / 1024).toFixed(1)} MB; covers can be at most 5 MB. Choose a smaller one.` });
      return;
    }
    void run(() => apiCall<CoverOutput>('POST', `${path}/upload`, file), 'Picture uploaded: it is the cover now.');
  }

  if (!cover) return message ? <p role="alert" className="font-semibold text-error">{message.text}</p> : <p className="text-ink-soft">Loading the cover…</p>;
  return (
    <div className="flex flex-col gap-4" data-cover-picker>
      <div className="flex flex-wrap items-start gap-4">
        <div className="h-28 w-48 overflow-hidden rounded-[10px] bg-ink">
          {cover.coverUrl && <img src={cover.coverUrl} alt="The class’s cover" className="h-full w-full object-cover" data-current-cover={cover.coverUrl} />}
        </div>
        <p className="max-w-md text-sm text-ink-soft">
          {cover.coverUrl
            ? cover.chosen
              ? 'You chose this cover. Library cards and the class page show it.'
              : 'The first work chapter’s picture, used until you choose another.'
            : 'No cover yet: once the class is published, the first work chapter’s picture becomes its cover. You can upload one now.'}
        </p>
      </div>
      {message && (
        <p role={message.tone === 'error' ? 'alert' : 'status'} className={message.tone === 'error' ? 'font-semibold text-error' : 'font-semibold text-mint-deep'}>
          {message.text}
        </p>
      )}
      {cover.chapters.length > 0 && (
        <fieldset>
          <legend className="mb-2 text-sm font-semibold">Use a chapter’s picture</legend>
          <ul className="grid grid-cols-2 gap-2 sm:grid-cols-4">
            {cover.chapters.map((c) => {
              const current = cover.coverUrl === c.thumbnailUrl;
              return (
                <li key={c.number}>
                  <button
                    type="button"
                    disabled={busy}
                    aria-pressed={current}
                    className={`flex w-full flex-col overflow-hidden rounded-[10px] border-2 text-left text-sm ${current ? 'border-ember-deep' : 'border-transparent hover:border-slate'}`}
                    onClick={() => void run(() => apiCall<CoverOutput>('PUT', path, { source: 'chapter', chapter: c.number }), `Chapter ${c.number} is the cover now.`)}
                  >
                    <img src={c.thumbnailUrl} alt="" loading="lazy" className="aspect-video w-full bg-ink object-cover" />
                    <span className="px-1 py-0.5">{c.number}. {c.title}</span>
                  </button>
                </li>
              );
            })}
          </ul>
        </fieldset>
      )}
      <CoverFromFrame lessonId={lessonId} disabled={busy} onCover={(next) => { setCover(next); setMessage(null); }} />
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-file`} className="text-sm font-semibold">Upload a picture (JPEG or PNG, at most 5 MB)</label>
          <input id={`${id}-file`} type="file" accept="image/jpeg,image/png" disabled={busy} onChange={(e) => { upload(e.target.files?.[0]); e.target.value = ''; }} />
        </div>
        {cover.chosen && (
          <button type="button" disabled={busy} className={smallButton} onClick={() => void run(() => apiCall<CoverOutput>('PUT', path, { source: 'default' }), 'Back to the first work chapter’s picture.')}>
            Use the first work chapter
          </button>
        )}
      </div>
    </div>
  );
}
