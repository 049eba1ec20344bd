import type { BulkCounts, BulkPreview } from '@shared/contract/quarantine.ts';
import { isReasonCode, REASON_LABELS } from './reason-labels.ts';

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en')} ${n === 1 ? one : many}`;
const reasonName = (code: string) => (isReasonCode(code) ? REASON_LABELS[code] : code);
const mono = (text: string | null) => <span className="break-all font-mono text-xs">{text ?? '—'}</span>;

/** Where the rows of a repair end up: stored, already stored, still in quarantine (by new reason), discarded. */
export function BulkCountsList({ counts, tense }: { counts: BulkCounts; tense: 'would' | 'did' }) {
  const verb = (would: string, did: string) => (tense === 'would' ? would : did);
  return (
    <div className="grid gap-2">
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        {[
          [verb('Would be stored', 'Stored'), counts.stored],
          [verb('Already stored', 'Were already stored'), counts.alreadyStored],
          [verb('Would stay in quarantine', 'Still in quarantine'), counts.stillQuarantined],
          [verb('Would be discarded', 'Discarded'), counts.discarded],
        ].map(([label, n]) => (
          <div key={label} className="rounded-lg border border-rule bg-paper p-2">
            <dt className="text-xs text-ink-soft">{label}</dt>
            <dd className="text-lg font-semibold tabular-nums">{Number(n).toLocaleString('en')}</dd>
          </div>
        ))}
      </dl>
      {counts.reasons.length > 0 && (
        <ul className="list-disc pl-5 text-sm">
          {counts.reasons.map((r) => (
            <li key={r.code}>
              {plural(r.count, 'row')} {verb('would stay', 'stayed')} for “{reasonName(r.code)}”, e.g. {r.example}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** The preview: the counts, and the first rows as they are now and as the repair would leave them. */
export function BulkPreviewTable({ preview }: { preview: BulkPreview }) {
  return (
    <div className="grid gap-3">
      <p className="text-sm">Of {plural(preview.selected, 'selected row')}, this is what the repair would do. Nothing has changed yet.</p>
      <BulkCountsList counts={preview} tense="would" />
      <div className="overflow-x-auto rounded-lg border border-rule" tabIndex={0}>
        <table className="w-full text-left text-sm">
          <caption className="sr-only">The first selected rows, now and after the repair</caption>
          <thead className="bg-paper text-xs text-ink-soft">
            <tr>
              <th className="px-3 py-2 font-medium">Channel now</th>
              <th className="px-3 py-2 font-medium">Time as received</th>
              <th className="px-3 py-2 font-medium">Value</th>
              <th className="px-3 py-2 font-medium">After the repair</th>
            </tr>
          </thead>
          <tbody>
            {preview.sample.map((row) => (
              <tr key={row.id} className="border-t border-rule align-top">
                <td className="px-3 py-2">{mono(row.before.channel)}</td>
                <td className="px-3 py-2">{mono(row.before.ts)}</td>
                <td className="px-3 py-2">{mono(row.before.value)}</td>
                <td className="px-3 py-2">
                  {row.after.outcome === 'stored' ? (
                    <span>
                      Stored in {mono(row.after.channel)} at {mono(row.after.ts.replace('.000Z', 'Z'))}
                    </span>
                  ) : row.after.outcome === 'quarantined' ? (
                    <span className="text-alert">Stays: {row.after.reason}</span>
                  ) : (
                    <span className="text-ink-soft">Discarded</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {preview.selected > preview.sample.length && <p className="text-xs text-ink-soft">The first {preview.sample.length} rows are shown.</p>}
    </div>
  );
}
