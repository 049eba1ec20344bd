import type { AnswerView, OperationView } from './api-outline.ts';
import { FieldsTable } from './fields-table.tsx';
import { WithCode } from './with-code.tsx';

/** How each way of signing in reads on the page (keys are the document's security scheme names). */
export const AUTH_LABELS: Record<string, string> = {
  sessionCookie: 'browser session',
  personalToken: 'personal token',
  ingestKey: 'ingest key',
};

const METHOD_LOOK: Record<OperationView['method'], string> = {
  get: 'border-lichen text-lichen-dark',
  post: 'border-amber text-ink',
  put: 'border-amber text-ink',
  patch: 'border-amber text-ink',
  delete: 'border-alert text-alert',
};

/** A path with its `{parameters}` set apart, so the parts a caller fills in stand out. */
function PathText({ path }: { path: string }) {
  return (
    <>
      {path.split(/(\{[^}]+\})/).map((part, i) =>
        part.startsWith('{') ? (
          <span key={i} className="rounded bg-amber/25 px-0.5">
            {part}
          </span>
        ) : (
          part
        ),
      )}
    </>
  );
}

/** Success answers in green, refusals in amber, server-side failures in the alert colour. */
function statusLook(status: string): string {
  if (/^[123]/.test(status)) return 'text-lichen-dark';
  if (status.startsWith('4')) return 'text-ink';
  return 'text-alert';
}

/** Every answer the operation documents: status, what it means, body media type and headers. */
function AnswersTable({ answers }: { answers: AnswerView[] }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="pb-1 text-left text-xs font-semibold uppercase tracking-wide text-ink-soft">Answers</caption>
        <thead className="sr-only">
          <tr>
            <th scope="col">Status</th>
            <th scope="col">Meaning</th>
          </tr>
        </thead>
        <tbody>
          {answers.map((a) => (
            <tr key={a.status} className="border-t border-rule/70 align-top">
              <th scope="row" className={`w-14 py-1.5 pr-3 font-mono text-xs font-bold ${statusLook(a.status)}`}>
                {a.status}
              </th>
              <td className="py-1.5 text-xs">
                <WithCode text={a.description} />
                {(a.mediaTypes.length > 0 || a.headers.length > 0) && (
                  <span className="text-ink-soft"> ({[...a.mediaTypes, ...a.headers.map((h) => `header ${h}`)].join('; ')})</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** One operation: method and path, what it does, who may call it and with what, its inputs and its answers. */
export function OperationCard({ op }: { op: OperationView }) {
  const auth = op.auth.length ? op.auth.map((a) => AUTH_LABELS[a] ?? a).join(' or ') : 'nothing (public)';
  return (
    <article aria-labelledby={`op-${op.id}`} className="grid gap-3 rounded-xl border border-rule bg-card p-4" data-testid="api-operation">
      <h3 id={`op-${op.id}`} className="flex flex-wrap items-baseline gap-3">
        <span className={`w-16 shrink-0 rounded border-l-4 bg-paper px-2 py-0.5 font-mono text-xs font-bold uppercase ${METHOD_LOOK[op.method]}`}>
          {op.method}
        </span>{' '}
        <code className="font-mono text-sm break-all">
          <PathText path={op.path} />
        </code>
      </h3>
      {op.summary && <p className="text-sm">{op.summary}</p>}
      <p className="text-xs text-ink-soft">
        Accepts: <span className="text-ink">{auth}</span>
        {op.permission && (
          <>
            {' · '}needs the permission <span className="font-mono text-ink">{op.permission}</span>
          </>
        )}
      </p>
      {op.pathParams.length > 0 && <FieldsTable caption="Path" rows={op.pathParams} />}
      {op.queryParams.length > 0 && <FieldsTable caption="Query" rows={op.queryParams} />}
      {op.body && <FieldsTable caption={`Body (${op.body.mediaType})`} rows={op.body.fields} />}
      {op.answers.length > 0 && <AnswersTable answers={op.answers} />}
    </article>
  );
}
