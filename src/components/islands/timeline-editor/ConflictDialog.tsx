import { useEffect, useRef } from 'react';
import type { TimelineDifference } from '~/lib/editor/timeline-diff';

export interface ConflictDialogProps {
  differences: TimelineDifference[];
  busy: boolean;
  onKeepMine(): void;
  onTakeTheirs(): void;
}

/**
 * Someone else saved this timeline first. Shows what differs and lets the user keep their own
 * marks (saved over the newer version) or take the other person's; never a silent overwrite.
 */
export default function ConflictDialog({ differences, busy, onKeepMine, onTakeTheirs }: ConflictDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
    return () => d?.close();
  }, []);
  const shown = differences.slice(0, 40);
  return (
    <dialog ref={ref} aria-labelledby="conflict-title" className="m-auto w-[min(44rem,calc(100vw-2rem))] rounded-[10px] bg-chalk p-6 text-ink backdrop:bg-ink/50" data-conflict onCancel={(e) => e.preventDefault()}>
      <h3 id="conflict-title" className="text-xl">Someone else saved this timeline</h3>
      <p className="mt-2">
        While you were marking, another person saved their own changes. Nothing is lost yet: choose whose marks to keep.
        {differences.length === 0 ? ' Your marks and theirs are the same.' : ` ${differences.length} ${differences.length === 1 ? 'mark differs' : 'marks differ'}:`}
      </p>
      {differences.length > 0 && (
        <div className="mt-3 max-h-72 overflow-y-auto rounded-[10px] border border-stone/70">
          <table className="w-full text-sm tabular">
            <thead className="sticky top-0 bg-paper text-left">
              <tr>
                <th scope="col" className="p-2">Yours</th>
                <th scope="col" className="p-2">Theirs</th>
              </tr>
            </thead>
            <tbody>
              {shown.map((d) => (
                <tr key={`${d.kind}-${d.id}`} className="border-t border-stone/40" data-difference={d.change}>
                  <td className="p-2">{d.mine ?? <em className="text-ink-soft">not in yours</em>}</td>
                  <td className="p-2">{d.theirs ?? <em className="text-ink-soft">not in theirs</em>}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {differences.length > shown.length && <p className="p-2 text-sm text-ink-soft">…and {differences.length - shown.length} more.</p>}
        </div>
      )}
      <div className="mt-4 flex flex-wrap gap-3">
        <button type="button" disabled={busy} onClick={onKeepMine} className="rounded-[10px] bg-ink px-4 py-2 font-bold text-paper disabled:opacity-60">
          Keep mine and save
        </button>
        <button type="button" disabled={busy} onClick={onTakeTheirs} className="rounded-[10px] border border-ink px-4 py-2 font-bold disabled:opacity-60">
          Take theirs
        </button>
      </div>
      <p className="mt-3 text-sm text-ink-soft">Taking theirs replaces your marks in the editor; Undo brings yours back until you leave the page.</p>
    </dialog>
  );
}
