import './zod-without-eval'; // first: before any schema is built
import { useId, useState, useSyncExternalStore, type FormEvent, type ReactNode } from 'react';
import { REVIEW_NOTE_MAX, type ReviewRequestOutput, type SentBackOutput } from '~/lib/api/review-schemas';
import { formatInstant, type StudioClock } from '~/lib/time/date-format';
import { ApiError, apiCall } from './api-client';
import { inputClass } from './plan-builder/fields';

interface Props {
  lessonId: string;
  /** The open hand-off when the page was rendered. */
  initial: ReviewRequestOutput | null;
  /** Staff may hand a class off (not an archived one). */
  canRequest: boolean;
  /** Coaches and the owner may send it back. */
  canSendBack: boolean;
  clock: StudioClock;
}

/** Nothing to subscribe to: only the server and browser snapshots differ. */
const noChanges = () => () => {};

type Message = { tone: 'ok' | 'error'; text: string; field?: 'request' | 'send-back' };

/**
 * "Ready for review" in the publishing panel: who prepared the class, when and their note; the
 * hand-off itself (with an optional note) and, for coaches and the owner, sending it back with a
 * note. Publishing (the panel's own form) ends the wait too.
 */
export default function ReviewHandOff({ lessonId, initial, canRequest, canSendBack, clock }: Props) {
  const id = useId();
  const [review, setReview] = useState(initial);
  const [note, setNote] = useState('');
  const [backNote, setBackNote] = useState('');
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<Message | null>(null);
  // The forms work only once the island runs (no form door): until then their buttons wait.
  const ready = useSyncExternalStore(noChanges, () => true, () => false);
  const path = `/api/lessons/${lessonId}/review`;

  async function run(field: Message['field'], call: () => Promise<string>) {
    setBusy(true);
    setMessage(null);
    try {
      setMessage({ tone: 'ok', text: await call() });
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      setMessage({ tone: 'error', text: err.message, field });
    } finally {
      setBusy(false);
    }
  }

  function handOff(e: FormEvent) {
    e.preventDefault();
    void run('request', async () => {
      setReview(await apiCall<ReviewRequestOutput>('PUT', path, { note }));
      setNote('');
      return 'Marked ready for review. Coaches and the owner have been told.';
    });
  }

  function sendBack(e: FormEvent) {
    e.preventDefault();
    void run('send-back', async () => {
      const { sentBackTo } = await apiCall<SentBackOutput>('POST', `${path}/send-back`, { note: backNote });
      setReview(null);
      setBackNote('');
      return sentBackTo ? `Sent back to ${sentBackTo} with your note.` : 'Sent back. It no longer waits for review.';
    });
  }

  const errorFor = (field: Message['field']) => (message?.tone === 'error' && message.field === field ? message.text : null);
  const requestForm = (
    <NoteForm
      id={`${id}-note`}
      label={<>Note for the coach <span className="font-normal text-ink-soft">(optional)</span></>}
      hint="What you did and anything they should look at first."
      value={note}
      onChange={setNote}
      invalid={!!errorFor('request')}
      disabled={busy || !ready}
      onSubmit={handOff}
      submit={review ? 'Mark ready again' : 'Mark ready for review'}
    />
  );

  return (
    <div className="mt-4 flex flex-col gap-3 border-t border-stone/50 pt-4" data-review-hand-off>
      <h3 className="font-bold">Review</h3>
      {review ? (
        <div className="rounded-[10px] border-l-4 border-sun bg-sun/10 p-3" data-review-request>
          <p>
            <span className="font-semibold">Ready for review.</span> {`Prepared by ${review.preparedBy ?? 'a former team member'}, `}
            <time dateTime={review.requestedAt}>{formatInstant(review.requestedAt, clock, 'dateTime')}</time>.
          </p>
          {review.note ? <blockquote className="mt-1 whitespace-pre-line border-l-2 border-stone pl-3 italic">{review.note}</blockquote> : <p className="mt-1 text-sm text-ink-soft">No note.</p>}
        </div>
      ) : (
        <p className="text-sm text-ink-soft" data-review-none>Not waiting for review.</p>
      )}
      {message && (
        <p role={message.tone === 'error' ? 'alert' : 'status'} className={message.tone === 'error' ? 'font-semibold text-error' : 'font-semibold text-mint-deep'}>
          {message.text}
        </p>
      )}
      {canSendBack && review && (
        <NoteForm
          id={`${id}-back`}
          label="What needs another look"
          value={backNote}
          onChange={setBackNote}
          invalid={!!errorFor('send-back')}
          disabled={busy || !ready}
          onSubmit={sendBack}
          submit="Send back with this note"
        />
      )}
      {canRequest &&
        (canSendBack ? (
          <details>
            <summary className="cursor-pointer font-semibold">Ask another coach or the owner to review it</summary>
            <div className="mt-2">{requestForm}</div>
          </details>
        ) : (
          requestForm
        ))}
    </div>
  );
}

/** One note and its button: the hand-off and the send-back share it. */
function NoteForm(p: {
  id: string;
  label: ReactNode;
  hint?: string;
  value: string;
  onChange: (value: string) => void;
  invalid: boolean;
  disabled: boolean;
  onSubmit: (e: FormEvent) => void;
  submit: string;
}) {
  return (
    <form onSubmit={p.onSubmit} className="flex flex-col gap-2" noValidate>
      <label htmlFor={p.id} className="font-semibold">{p.label}</label>
      <textarea
        id={p.id}
        rows={2}
        maxLength={REVIEW_NOTE_MAX}
        value={p.value}
        onChange={(e) => p.onChange(e.target.value)}
        // Until the island runs, typing would be wiped when React takes the field over.
        readOnly={p.disabled && !p.value}
        aria-invalid={p.invalid}
        aria-describedby={p.hint ? `${p.id}-hint` : undefined}
        className={inputClass}
      />
      {p.hint && <p id={`${p.id}-hint`} className="text-sm text-ink-soft">{p.hint}</p>}
      <button type="submit" disabled={p.disabled} className="self-start rounded-[10px] border border-ink px-4 py-2 font-semibold disabled:opacity-50">
        {p.submit}
      </button>
    </form>
  );
}
