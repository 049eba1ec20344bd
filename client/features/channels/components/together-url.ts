import { MAX_RANGE_MS, type TimeRange } from '@shared/contract/channels.ts';

/** Most channels one chart takes (issue #18 item 4). */
export const MAX_TOGETHER = 6;

/**
 * The query string of the channels-together page, so a link shows a colleague the same chart:
 * `channels` (channel ids, comma-separated, in the order chosen), `from` and `to` (epoch ms,
 * `from` inclusive, `to` exclusive, as the channel page's links carry them) and `zone` (the
 * IANA zone the times are shown in).
 */
export const TOGETHER_PARAMS = { channels: 'channels', from: 'from', to: 'to', zone: 'zone' } as const;

/** What the page's URL asks for, with every part it could not use named in `problems`. */
export interface TogetherRequest {
  /** Channel ids to draw, in order, without repeats, at most {@link MAX_TOGETHER}. */
  ids: number[];
  /** The range, or null when the URL gives none (or a bad one) and the default applies. */
  range: TimeRange | null;
  /** The zone asked for, unchecked (which zones are allowed depends on the channels). */
  zone: string | null;
  /** Messages in the house form `field: what was wrong; what was done instead`. */
  problems: string[];
}

const WHOLE_ID = /^\d{1,15}$/;
const EPOCH_MS = /^-?\d{1,16}$/;

/** Quotes a piece of the URL for a message, cut short so a hostile URL cannot flood the page. */
function quoted(text: string): string {
  return `“${text.length > 24 ? `${text.slice(0, 24)}…` : text}”`;
}

/**
 * Reads the page's query string. Never throws: a part that cannot be used is left out and named
 * in `problems` (not a number, a repeat, more than six channels, a bad or reversed range, a range
 * longer than the server answers), so the page can say what it kept.
 */
export function readTogetherParams(params: URLSearchParams): TogetherRequest {
  const problems: string[] = [];
  const ids: number[] = [];
  const notNumbers: string[] = [];
  const repeats = new Set<number>();
  const raw = (params.get(TOGETHER_PARAMS.channels) ?? '')
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean);
  for (const token of raw) {
    const id = Number(token);
    if (!WHOLE_ID.test(token) || id < 1) notNumbers.push(token);
    else if (ids.includes(id)) repeats.add(id);
    else ids.push(id);
  }
  if (notNumbers.length > 0)
    problems.push(
      `channels: ${notNumbers.map(quoted).join(', ')} ${notNumbers.length === 1 ? 'is not a channel number' : 'are not channel numbers'}; left out.`,
    );
  if (repeats.size > 0) problems.push(`channels: ${[...repeats].join(', ')} listed more than once; drawn once.`);
  let kept = ids;
  if (ids.length > MAX_TOGETHER) {
    kept = ids.slice(0, MAX_TOGETHER);
    problems.push(
      `channels: ${ids.length} channels asked for, but one chart takes at most ${MAX_TOGETHER}; kept the first ${MAX_TOGETHER} (${kept.join(', ')}), left out ${ids.slice(MAX_TOGETHER).join(', ')}.`,
    );
  }
  return { ids: kept, range: readRange(params, problems), zone: params.get(TOGETHER_PARAMS.zone)?.trim() || null, problems };
}

function readRange(params: URLSearchParams, problems: string[]): TimeRange | null {
  const fromText = params.get(TOGETHER_PARAMS.from);
  const toText = params.get(TOGETHER_PARAMS.to);
  if (fromText === null && toText === null) return null;
  const instead = 'showing the last 7 days instead.';
  if (fromText === null || toText === null) {
    problems.push(`${fromText === null ? 'from' : 'to'}: missing (a range needs both from and to); ${instead}`);
    return null;
  }
  for (const [name, text] of [
    ['from', fromText],
    ['to', toText],
  ] as const) {
    if (!EPOCH_MS.test(text.trim()) || !Number.isSafeInteger(Number(text))) {
      problems.push(`${name}: ${quoted(text)} is not a time in epoch milliseconds; ${instead}`);
      return null;
    }
  }
  const range = { from: Number(fromText), to: Number(toText) };
  if (range.from >= range.to) {
    problems.push(`to: must be after from; ${instead}`);
    return null;
  }
  if (range.to - range.from > MAX_RANGE_MS) {
    problems.push(`to: the range must be at most 20 years; ${instead}`);
    return null;
  }
  return range;
}

/**
 * The page's query string for a selection: the inverse of {@link readTogetherParams} for good
 * input (`readTogetherParams(writeTogetherParams(x))` gives `x` back with no problems).
 */
export function writeTogetherParams(v: { ids: readonly number[]; range?: TimeRange | null; zone?: string | null }): URLSearchParams {
  const q = new URLSearchParams();
  q.set(TOGETHER_PARAMS.channels, v.ids.join(','));
  if (v.range) {
    q.set(TOGETHER_PARAMS.from, String(v.range.from));
    q.set(TOGETHER_PARAMS.to, String(v.range.to));
  }
  if (v.zone) q.set(TOGETHER_PARAMS.zone, v.zone);
  return q;
}

/**
 * `params` with the range and zone replaced and everything else (the channel list exactly as
 * written, so a problem with it stays visible) kept.
 */
export function withRangeAndZone(params: URLSearchParams, range: TimeRange, zone: string | null): URLSearchParams {
  const next = new URLSearchParams(params);
  next.set(TOGETHER_PARAMS.from, String(range.from));
  next.set(TOGETHER_PARAMS.to, String(range.to));
  if (zone) next.set(TOGETHER_PARAMS.zone, zone);
  else next.delete(TOGETHER_PARAMS.zone);
  return next;
}
