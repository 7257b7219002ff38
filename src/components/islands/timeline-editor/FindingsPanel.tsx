import { memo } from 'react';
import type { CheckResult, Finding, Severity } from '~/lib/timing/finding-types';
import { formatEditorTime } from '~/lib/time/format-time';

const SEVERITY: Record<Severity, { word: string; icon: string; className: string }> = {
  error: { word: 'Error', icon: '✕', className: 'bg-error text-chalk' },
  warning: { word: 'Warning', icon: '!', className: 'bg-warning text-chalk' },
  info: { word: 'Info', icon: 'i', className: 'bg-info text-chalk' },
};

export interface FindingsPanelProps {
  result: CheckResult | null;
  hasPlan: boolean;
  onShow(finding: Finding): void;
  onApplyFix(finding: Finding): void;
  /** A missing station: mark it at the playhead, or leave it out of the plan. */
  onMarkHere?(finding: Finding): void;
  onLeaveOut?(finding: Finding): void;
  onApplyAll(): void;
}

/** The timing check's findings, by time: click one to go there; apply its suggested fix. */
function FindingsPanel({ result, hasPlan, onShow, onApplyFix, onMarkHere, onLeaveOut, onApplyAll }: FindingsPanelProps) {
  if (!hasPlan) {
    return (
      <section aria-labelledby="findings-title" className="rounded-[10px] border border-stone/70 p-4">
        <h3 id="findings-title" className="text-lg">Timing check</h3>
        <p className="mt-2 text-ink-soft">This class has no plan yet, so there is nothing to check the marks against. Add a plan, then come back.</p>
      </section>
    );
  }
  const findings = result?.findings ?? [];
  const errors = findings.filter((f) => f.severity === 'error').length;
  const warnings = findings.filter((f) => f.severity === 'warning').length;
  const fixable = findings.filter((f) => f.fix).length;
  return (
    <section aria-labelledby="findings-title" className="flex min-h-0 flex-col rounded-[10px] border border-stone/70 p-4 lg:max-h-[min(60vh,28rem)]" data-findings>
      <div className="flex flex-wrap items-center gap-2">
        <h3 id="findings-title" className="text-lg">Timing check</h3>
        <p className="text-sm text-ink-soft" role="status" data-check-summary>
          {errors === 0 && warnings === 0 ? 'No errors, no warnings.' : `${errors} ${errors === 1 ? 'error' : 'errors'}, ${warnings} ${warnings === 1 ? 'warning' : 'warnings'}`}
        </p>
        {fixable > 0 && (
          <button type="button" onClick={onApplyAll} className="ml-auto rounded-[10px] border border-ink px-3 py-1 text-sm font-bold hover:bg-ink hover:text-paper">
            Apply all fixes ({fixable})
          </button>
        )}
      </div>
      {findings.length === 0 ? (
        <p className="mt-3 rounded-[10px] bg-mint/10 p-3 font-semibold text-mint-deep">The marks match the plan. Nicely done.</p>
      ) : (
        <ol className="mt-3 flex min-h-0 flex-col gap-2 overflow-y-auto pr-1" aria-label="Findings by time">
          {findings.map((f, i) => {
            const sev = SEVERITY[f.severity];
            return (
              <li key={`${f.code}-${f.atSeconds}-${i}`} className="rounded-[10px] border border-stone/60 bg-chalk p-3" data-finding={f.code} data-severity={f.severity}>
                <div className="flex flex-wrap items-center gap-2 text-sm">
                  <span className={`inline-flex items-center gap-1 rounded-full px-2 font-bold ${sev.className}`}>
                    <span aria-hidden="true">{sev.icon}</span>
                    {sev.word}
                  </span>
                  <button type="button" className="tabular font-semibold underline underline-offset-2" onClick={() => onShow(f)} aria-label={`Go to ${formatEditorTime(f.atSeconds)}: ${f.message}`}>
                    {formatEditorTime(f.atSeconds)}
                  </button>
                  {f.fix && (
                    <button type="button" onClick={() => onApplyFix(f)} className="ml-auto rounded-[10px] bg-ink px-3 py-0.5 font-bold text-paper" aria-label={`Apply fix: ${f.message}`}>
                      Apply fix
                    </button>
                  )}
                </div>
                <p className="mt-1 text-sm">{f.message}</p>
                {f.missing && (
                  <div className="mt-2 flex flex-wrap gap-2">
                    {onMarkHere && (
                      <button type="button" onClick={() => onMarkHere(f)} className="rounded-[10px] border border-ink px-3 py-0.5 text-sm font-bold hover:bg-ink hover:text-paper" title="Adds the work interval at the playhead with its planned length">
                        Mark it here
                      </button>
                    )}
                    {onLeaveOut && f.missing.round !== undefined && f.missing.stationIndex !== undefined && (
                      <button type="button" onClick={() => onLeaveOut(f)} className="rounded-[10px] border border-ink px-3 py-0.5 text-sm font-bold hover:bg-ink hover:text-paper" title="Records in the plan that this round skips the station">
                        Leave it out of this class
                      </button>
                    )}
                  </div>
                )}
              </li>
            );
          })}
        </ol>
      )}
    </section>
  );
}

export default memo(FindingsPanel);
