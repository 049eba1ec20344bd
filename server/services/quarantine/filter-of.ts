import type { QuarantineFilterInput } from '../../contract/quarantine.ts';
import type { QuarantineFilter } from '../../db/quarantine.repo.ts';

/** The list's filter as the contract carries it (query or bulk selection), as the repo takes it. */
export function filterOf(f: Partial<QuarantineFilterInput>): QuarantineFilter {
  return {
    loggerId: f.loggerId,
    reasonCode: f.reason,
    channelKey: f.channel,
    source: f.source,
    receivedFrom: f.receivedFrom ? new Date(f.receivedFrom) : undefined,
    receivedTo: f.receivedTo ? new Date(f.receivedTo) : undefined,
  };
}
