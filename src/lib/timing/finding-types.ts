/** Shapes of the timing check's result. */

/** Exactly the finding codes of the public API. */
export const FINDING_CODES = [
  'overlap',
  'gap',
  'outside-media',
  'work-too-long',
  'work-too-short',
  'rest-too-long',
  'rest-too-short',
  'block-length',
  'missing-station',
  'unexpected-station',
  'out-of-order',
  'round-count',
  'length-vs-advertised',
  'cue-outside-segment',
  'countdown-late',
] as const;

export type FindingCode = (typeof FINDING_CODES)[number];
export type Severity = 'error' | 'warning' | 'info';

/** Rank used to order findings at the same time: errors first. */
export const SEVERITY_RANK: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

/** One change a suggested fix makes: set a segment's start or end to `value` seconds. */
export interface FixChange {
  segmentId: string;
  field: 'startSeconds' | 'endSeconds';
  value: number;
}

export interface Finding {
  code: FindingCode;
  severity: Severity;
  /** Where in the recording the finding is, in seconds. */
  atSeconds: number;
  segmentIds: string[];
  /** Ids of cues concerned (cue findings only). */
  cueIds?: string[];
  /** Plain-language message: what happened and what to do. */
  message: string;
  /** A suggested fix: one change, or several applied together. */
  fix?: FixChange | FixChange[];
  /**
   * `missing-station` only: the planned work interval that is not marked, so the editor can
   * mark it at the playhead or leave it out of the plan.
   */
  missing?: MissingWork;
}

export interface MissingWork {
  blockIndex: number;
  /** 0-based station of a circuit. */
  stationIndex?: number;
  /** 1-based round of a circuit, or set of intervals. */
  round?: number;
  set?: number;
  exercise?: string;
  /** Planned length of the work interval. */
  seconds: number;
}

export interface RoundTotals {
  round: number;
  plannedWorkSeconds: number;
  markedWorkSeconds: number;
  plannedRestSeconds: number;
  markedRestSeconds: number;
}

export interface BlockTotals {
  blockIndex: number;
  kind: 'warmup' | 'circuit' | 'intervals' | 'cooldown' | 'talk';
  plannedSeconds: number;
  markedSeconds: number;
  plannedWorkSeconds: number;
  markedWorkSeconds: number;
  plannedRestSeconds: number;
  markedRestSeconds: number;
  /** Circuits: per round; intervals: per set. */
  rounds: RoundTotals[];
}

export interface KindTotals {
  workSeconds: number;
  restSeconds: number;
  roundBreakSeconds: number;
  warmupSeconds: number;
  cooldownSeconds: number;
  talkSeconds: number;
  /** First segment start to last segment end. */
  classSeconds: number;
}

export interface CheckTotals {
  planned: KindTotals;
  marked: KindTotals & { introSeconds: number; outroSeconds: number };
  blocks: BlockTotals[];
  advertisedSeconds: number | null;
  /** Marked class length minus advertised length (null without an advertised length). */
  classVsAdvertisedSeconds: number | null;
  mediaSeconds: number | null;
}

export interface CheckResult {
  /** True when there is no finding of severity `error`. */
  ok: boolean;
  findings: Finding[];
  totals: CheckTotals;
}

export interface CheckContext {
  /** Length of the recording; without it `outside-media` is not checked. */
  mediaSeconds?: number | null;
  /** Advertised length in minutes; without it `length-vs-advertised` is not checked. */
  advertisedMinutes?: number | null;
}
