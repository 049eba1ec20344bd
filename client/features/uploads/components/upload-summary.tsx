import { Link } from 'react-router-dom';
import { buttonClasses } from '../../../components/button.tsx';
import type { ImportSummary } from '@shared/contract/uploads.ts';

const NUMBER = new Intl.NumberFormat();

/**
 * The end of an import: lines read, readings found, stored, already there, quarantined; the
 * first quarantined readings with their line in the file and the reason; and the way to the
 * quarantine page (filtered to this logger) where all of them can be fixed.
 */
export function UploadSummary({ summary, quarantineHref, onAgain }: { summary: ImportSummary; quarantineHref: string; onAgain: () => void }) {
  const counts: Array<[string, number, string]> = [
    ['Lines read', summary.lines, 'lines'],
    ['Readings in the file', summary.readings, 'readings'],
    ['Stored', summary.accepted, 'stored'],
    ['Already stored', summary.duplicates, 'duplicates'],
    ['Quarantined', summary.quarantined, 'quarantined'],
  ];
  return (
    <section aria-labelledby="upload-summary-heading" className="grid gap-4 rounded-xl border-2 border-lichen bg-card p-5">
      <h3 id="upload-summary-heading" className="text-lg font-semibold">
        Import finished
      </h3>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-5">
        {counts.map(([label, value, id]) => (
          <div key={id} className="rounded-lg border border-rule p-3">
            <dt className="text-xs uppercase tracking-wide text-ink-soft">{label}</dt>
            <dd className="font-mono text-xl" data-testid={`summary-${id}`}>
              {NUMBER.format(value)}
            </dd>
          </div>
        ))}
      </dl>
      {summary.firstQuarantined.length > 0 && (
        <div className="grid gap-2">
          <h4 className="font-medium">
            {summary.quarantined > summary.firstQuarantined.length
              ? `The first ${summary.firstQuarantined.length} quarantined readings`
              : 'Quarantined readings'}
          </h4>
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Quarantined readings with their line in the file</caption>
            <thead className="text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-4">
                  Line
                </th>
                <th scope="col" className="py-1 pr-4">
                  Reason
                </th>
              </tr>
            </thead>
            <tbody>
              {summary.firstQuarantined.map((q) => (
                <tr key={q.index} className="border-t border-rule/70">
                  <td className="py-1 pr-4 font-mono">{q.line}</td>
                  <td className="py-1 pr-4">{q.reason}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <div className="flex flex-wrap gap-2">
        {summary.quarantined > 0 && (
          <Link to={quarantineHref} className={buttonClasses('primary')}>
            Review the quarantined rows
          </Link>
        )}
        <button type="button" onClick={onAgain} className={buttonClasses('secondary')}>
          Upload another file
        </button>
      </div>
    </section>
  );
}
