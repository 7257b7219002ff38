import { memo } from 'react';
import type { CheckResult } from '~/lib/timing/finding-types';
import { formatLength } from '~/lib/time/format-time';
import { BLOCK_KIND_LABELS as BLOCK_WORDS } from '~/lib/plan/plan-editing';

const UNIT_WORDS = { intervals: 'set', emom: 'minute' } as Partial<Record<keyof typeof BLOCK_WORDS, string>>;

/** Marked against planned: work and rest per round, and class length against the advertised length. */
function CheckSummary({ result }: { result: CheckResult | null }) {
  if (!result) return null;
  const { totals } = result;
  const diff = totals.classVsAdvertisedSeconds;
  return (
    <section aria-labelledby="summary-title" className="rounded-[10px] border border-stone/70 p-4" data-summary>
      <h3 id="summary-title" className="text-lg">Marked against planned</h3>
      <p className="mt-1 text-sm tabular" data-class-length>
        Class length <strong>{formatLength(totals.marked.classSeconds)}</strong>
        {totals.advertisedSeconds !== null && (
          <>
            {' '}· advertised <strong>{formatLength(totals.advertisedSeconds)}</strong>
            {diff !== null && <> ({diff >= 0 ? '+' : '−'}{formatLength(Math.abs(diff))})</>}
          </>
        )}
      </p>
      {/* Scrolls on its own, so it takes keyboard focus to scroll without a mouse (WCAG 2.1.1). */}
      <div className="mt-2 max-h-64 overflow-y-auto" tabIndex={0} role="region" aria-label="Work and rest per block and round">
        <table className="w-full text-sm tabular">
          <caption className="sr-only">Work and rest per block and round, marked against planned</caption>
          <thead>
            <tr className="text-left text-ink-soft">
              <th scope="col" className="py-1 pr-2 font-semibold">Part</th>
              <th scope="col" className="py-1 pr-2 font-semibold">Work (or block) marked / planned</th>
              <th scope="col" className="py-1 font-semibold">Rest marked / planned</th>
            </tr>
          </thead>
          <tbody>
            {totals.blocks.flatMap((b) => {
              const rows =
                b.rounds.length > 0
                  ? b.rounds.map((r) => ({
                      key: `${b.blockIndex}-${r.round}`,
                      label: `${BLOCK_WORDS[b.kind]} ${UNIT_WORDS[b.kind] ?? 'round'} ${r.round}`,
                      work: [r.markedWorkSeconds, r.plannedWorkSeconds],
                      rest: [r.markedRestSeconds, r.plannedRestSeconds],
                    }))
                  : [{ key: `${b.blockIndex}`, label: BLOCK_WORDS[b.kind], work: [b.markedSeconds, b.plannedSeconds], rest: null }];
              return rows.map((row) => {
                const off = Math.abs((row.work[0] ?? 0) - (row.work[1] ?? 0)) > 0.05 || (row.rest !== null && Math.abs((row.rest[0] ?? 0) - (row.rest[1] ?? 0)) > 0.05);
                return (
                  <tr key={row.key} className="border-t border-stone/40">
                    <th scope="row" className="py-1 pr-2 text-left font-normal">
                      {row.label}
                      {off && <span className="ml-1 text-warning" title="Differs from the plan">≠</span>}
                    </th>
                    <td className="py-1 pr-2">{formatLength(row.work[0] ?? 0)} / {formatLength(row.work[1] ?? 0)}</td>
                    <td className="py-1">{row.rest ? `${formatLength(row.rest[0] ?? 0)} / ${formatLength(row.rest[1] ?? 0)}` : '—'}</td>
                  </tr>
                );
              });
            })}
          </tbody>
        </table>
      </div>
    </section>
  );
}

export default memo(CheckSummary);
