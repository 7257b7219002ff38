/**
 * The temporal dimension of W3C Media Fragments URI 1.0 (§4.2.1): `t=[npt:]begin[,end]`, times as
 * seconds (`10.5`), `mm:ss[.f]` or `hh:mm:ss[.f]`. Begin defaults to 0 and end to the media's end;
 * the range must not be empty (`t=,` is a syntax error; `t=3,3` and `t=7,3` are invalid).
 * No maintained npm parser exists for this, so it is written here and tested on the W3C cases.
 */
export interface TemporalFragment {
  start: number;
  end: number | null;
}

const NPT_TIME = /^(?:(\d+):)?(\d{1,2}):(\d{2}(?:\.\d*)?)$|^(\d+(?:\.\d*)?)$/;

/** Parses one npt time; null when malformed (minutes and seconds must be 00–59). */
export function parseNptTime(text: string): number | null {
  const m = NPT_TIME.exec(text);
  if (!m) return null;
  if (m[4] !== undefined) return Number(m[4]);
  const hours = m[1] !== undefined ? Number(m[1]) : 0;
  const minutes = Number(m[2]);
  const seconds = Number(m[3]);
  if (minutes > 59 || seconds >= 60) return null;
  return hours * 3600 + minutes * 60 + seconds;
}

/** Reads `t=` from a fragment such as `#t=90` or `t=npt:1:30,2:00&xywh=...`; null when absent or invalid. */
export function parseTemporalFragment(fragment: string): TemporalFragment | null {
  const params = fragment.replace(/^#/, '').split('&');
  const t = params.map((p) => p.split('=')).find(([name]) => name === 't');
  if (!t || t.length !== 2) return null;
  let value = decodeURIComponent(t[1]!);
  if (value.startsWith('npt:')) value = value.slice(4);
  const [beginText, endText, ...rest] = value.split(',');
  if (rest.length || beginText === undefined) return null;
  if (beginText === '' && (endText === undefined || endText === '')) return null; // "t=" and "t=,"
  const start = beginText === '' ? 0 : parseNptTime(beginText);
  if (start === null) return null;
  if (endText === undefined) return { start, end: null };
  const end = parseNptTime(endText);
  if (end === null || end <= start) return null;
  return { start, end };
}

/** A `#t=` fragment for a chapter start, in seconds with at most 3 decimals. */
export const temporalFragment = (seconds: number) => `#t=${Number(seconds.toFixed(3))}`;
