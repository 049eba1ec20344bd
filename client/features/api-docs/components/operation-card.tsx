import type { OperationView } from './api-outline.ts';
import { FieldsTable } from './fields-table.tsx';

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

/** One operation: method and path, what it does, who may call it and with what, and its inputs. */
export function OperationCard({ op }: { op: OperationView }) {
  const auth = op.auth.length ? op.auth.map((a) => AUTH_LABELS[a] ?? a).join(' or ') : 'nothing (public)';
  return (
    <article aria-labelledby={`op-${op.id}`} className="grid gap-3 rounded-xl border border-rule bg-card p-4" data-testid="api-operation">
      <h3 id={`op-${op.id}`} className="flex flex-wrap items-baseline gap-3">
        <span className={`w-16 shrink-0 rounded border-l-4 bg-paper px-2 py-0.5 font-mono text-xs font-bold uppercase ${METHOD_LOOK[op.method]}`}>{op.method}</span>{' '}
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
    </article>
  );
}
