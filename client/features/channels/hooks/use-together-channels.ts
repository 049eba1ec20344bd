import { useMemo } from 'react';
import { useQueries } from '@tanstack/react-query';
import type { ChannelState } from '@shared/contract/channels.ts';
import { useChannels } from '../api/get-channels.ts';
import { channelQueryOptions } from '../api/get-channel.ts';
import { ApiError } from '../../../lib/api-client.ts';

/** The channels a URL names, found in the lab, with what could not be used. */
export interface TogetherChannels {
  pending: boolean;
  /** A failure other than "no such channel" (the network, the session), or null. */
  error: Error | null;
  /** The channels found, in the URL's order. */
  channels: ChannelState[];
  /** `channels: …` messages for ids not in this lab and for retired channels. */
  problems: string[];
}

const notFound = (err: unknown) => err instanceof ApiError && err.status === 404;

/**
 * Finds `ids` among the lab's channels: the overview (one request) holds every live channel;
 * an id it lacks is asked for on its own, which tells a retired channel (found, drawn with a
 * note: its history stays readable) from one that is not in this lab (404 — unknown, or
 * another lab's, which the server does not tell apart — left out with a message).
 */
export function useTogetherChannels(slug: string, ids: readonly number[]): TogetherChannels {
  const overview = useChannels(slug);
  const live = useMemo(() => new Map((overview.data?.channels ?? []).map((c) => [c.id, c as ChannelState])), [overview.data]);
  const missing = overview.data ? ids.filter((id) => !live.has(id)) : [];
  const lookups = useQueries({
    queries: missing.map((id) => ({ ...channelQueryOptions(slug, id), retry: (n: number, err: unknown) => !notFound(err) && n < 2 })),
  });
  if (overview.isPending) return { pending: true, error: null, channels: [], problems: [] };
  if (overview.isError) return { pending: false, error: overview.error, channels: [], problems: [] };
  if (lookups.some((q) => q.isPending)) return { pending: true, error: null, channels: [], problems: [] };
  const failed = lookups.find((q) => q.isError && !notFound(q.error));
  if (failed?.error) return { pending: false, error: failed.error, channels: [], problems: [] };

  const found = new Map(live);
  const unknown: number[] = [];
  const retired: string[] = [];
  missing.forEach((id, i) => {
    const c = lookups[i].data?.channel;
    if (!c) return unknown.push(id);
    found.set(id, c);
    retired.push(`${c.logger.name} · ${c.label} [${id}] ${c.retiredAt ? `was retired on ${c.retiredAt.slice(0, 10)}` : 'belongs to a retired logger'}`);
  });
  const problems: string[] = [];
  if (unknown.length) problems.push(`channels: this lab has no channel ${unknown.join(', ')}; left out.`);
  if (retired.length) problems.push(`channels: ${retired.join('; ')}: its stored readings are still drawn, no new ones arrive.`);
  return { pending: false, error: null, channels: ids.flatMap((id) => found.get(id) ?? []), problems };
}
