import { TIME_LAYOUT_LABELS, type TimePreviewAnswer, type UploadTimeFormat } from '@shared/contract/uploads.ts';
import { Button } from '../../../components/button.tsx';
import { Notice } from '../../../components/notice.tsx';

const layoutName = (f: UploadTimeFormat | null) =>
  f === null ? 'no layout' : f === 'auto' ? 'ISO 8601 or epoch milliseconds' : f === 'pattern' ? 'your pattern' : TIME_LAYOUT_LABELS[f];

/**
 * How the file's first times will be stored: each text as received, the wall-clock time in the
 * chosen zone and the instant in UTC, or why it cannot be read; rows the layouts read differently
 * (03/04 could be March or April) are flagged. When the rows suggest another layout, it is offered.
 */
export function TimePreviewTable({
  answer,
  asked,
  onUseLayout,
}: {
  answer: TimePreviewAnswer;
  asked: UploadTimeFormat;
  onUseLayout: (f: UploadTimeFormat) => void;
}) {
  // with auto, the layout that read the rows instead; otherwise, when the chosen one fails, the one the rows suggest
  const suggestion =
    asked === 'auto' && answer.layout !== 'auto' && answer.layout !== null && answer.layout !== 'pattern'
      ? answer.layout
      : asked !== 'auto' && !answer.readable && answer.guess.chosen && answer.guess.chosen !== asked
        ? answer.guess.chosen
        : null;
  return (
    <section aria-label="How the times will be stored" className="grid gap-2">
      <h3 className="text-sm font-medium">How the times will be stored</h3>
      <p className="text-sm text-ink-soft">
        {asked === 'auto' && answer.layout && answer.layout !== 'auto'
          ? `Read as ${layoutName(answer.layout)} (recognised from the first rows); choose it above to upload with it.`
          : `Read as ${layoutName(answer.layout)}, in ${answer.timeZone}.`}
      </p>
      <div className="overflow-x-auto" tabIndex={0}>
        <table className="min-w-full text-sm">
          <thead>
            <tr className="text-left text-ink-soft">
              <th scope="col" className="py-1 pr-4 font-medium">
                Row
              </th>
              <th scope="col" className="py-1 pr-4 font-medium">
                In the file
              </th>
              <th scope="col" className="py-1 pr-4 font-medium">
                Stored as ({answer.timeZone})
              </th>
              <th scope="col" className="py-1 pr-4 font-medium">
                UTC
              </th>
              <th scope="col" className="py-1 font-medium">
                Note
              </th>
            </tr>
          </thead>
          <tbody>
            {answer.rows.map((r) => (
              <tr key={r.row} className="border-t border-rule">
                <td className="py-1 pr-4 tabular-nums">{r.row}</td>
                <td className="py-1 pr-4 font-mono">{r.text}</td>
                <td className="py-1 pr-4 tabular-nums">{r.local ?? '—'}</td>
                <td className="py-1 pr-4 tabular-nums">{r.utc ? r.utc.replace('T', ' ').replace('.000Z', ' UTC') : '—'}</td>
                <td className={`py-1 ${r.problem ? 'text-alert' : ''}`}>{r.problem ?? (r.ambiguous ? 'could be read day first or month first' : '')}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {!answer.readable && (
        <Notice tone="alert">
          <p>
            {answer.layout === null
              ? (answer.guess.reason ?? 'No layout reads these times.')
              : `Some of these times cannot be read as ${layoutName(answer.layout)}; the upload will not start until they can.`}
          </p>
        </Notice>
      )}
      {suggestion && (
        <div>
          <Button size="sm" onClick={() => onUseLayout(suggestion)}>
            Read the times as {TIME_LAYOUT_LABELS[suggestion]}
          </Button>
        </div>
      )}
    </section>
  );
}
