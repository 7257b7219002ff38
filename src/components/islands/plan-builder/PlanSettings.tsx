import type { PlanDraftApi } from './use-plan-draft';
import { NumberField } from './fields';

/** One plain sentence per setting: what changing it changes. */
const TOLERANCES = [
  { name: 'workSeconds', label: 'Work tolerance (s)', hint: 'How many seconds a marked work interval may differ from its planned length before the check reports it.' },
  { name: 'restSeconds', label: 'Rest tolerance (s)', hint: 'The same for rests and round breaks, which usually run looser.' },
  { name: 'blockSeconds', label: 'Warm-up, cool-down and talk tolerance (s)', hint: 'The same for warm-up, cool-down and talk.' },
  { name: 'gapSeconds', label: 'Allowed gap (s)', hint: 'Unmarked seconds between two segments that the check lets pass without a finding.' },
  { name: 'advertisedPercent', label: 'Advertised length tolerance (%)', hint: 'How far the class may run from its advertised length before the check warns.' },
] as const;

const OPTIONS = [
  {
    name: 'roundBreakReplacesLastRest',
    label: 'The round break replaces the last station’s rest',
    hint: 'When on, a round ends with its last work and goes straight into the round break; when off, the last station’s rest comes first and the break follows.',
  },
  {
    name: 'dropFinalRest',
    label: 'End each circuit or intervals block on work',
    hint: 'When on, there is no rest after the very last work interval of a block (the next block starts right away).',
  },
] as const;

export default function PlanSettings({ d }: { d: PlanDraftApi }) {
  return (
    <details className="rounded-[10px] border border-stone/70 p-3" data-plan-settings>
      <summary className="cursor-pointer font-bold">Tolerances and rests</summary>
      <div className="mt-3 grid gap-4 sm:grid-cols-2">
        {TOLERANCES.map((t) => (
          <NumberField
            key={t.name}
            label={t.label}
            value={d.draft.tolerances[t.name]}
            onChange={(v) => d.setTolerance(t.name, v as number)}
            error={d.fields[`tolerances.${t.name}`]}
            hint={t.hint}
            step={t.name === 'advertisedPercent' ? 1 : 0.5}
          />
        ))}
      </div>
      <div className="mt-4 flex flex-col gap-3">
        {OPTIONS.map((o) => (
          <label key={o.name} className="flex items-start gap-2">
            <input type="checkbox" className="mt-1 h-4 w-4 accent-ink" checked={d.draft.options[o.name] ?? true} onChange={(e) => d.setOption(o.name, e.target.checked)} />
            <span>
              <span className="font-semibold">{o.label}</span>
              <span className="block text-sm text-ink-soft">{o.hint}</span>
            </span>
          </label>
        ))}
      </div>
    </details>
  );
}
