import { ROLE_LABELS, ROLE_PERMISSIONS, ROLES, type Permission } from '@shared/policies/permissions.ts';
import { CopyButton } from '../../../components/copy-button.tsx';
import type { AnswerView, OperationView } from './api-outline.ts';
import { FieldList } from './field-list.tsx';
import { requestExample } from './request-example.ts';
import { WithCode } from './with-code.tsx';

/** How each way of signing in reads on the page (keys are the document's security scheme names). */
export const AUTH_LABELS: Record<string, string> = {
  sessionCookie: 'a browser session',
  personalToken: 'a personal token',
  ingestKey: 'a logger’s ingest key',
};

/** What an answer's status means, in a few plain words, before the document's own description. */
const STATUS_WORDS: Record<string, string> = {
  '200': 'Done',
  '201': 'Made',
  '202': 'Taken on, finished later',
  '204': 'Done, nothing to send back',
  '302': 'Sent on elsewhere',
  '303': 'Sent on elsewhere',
  '400': 'Input refused',
  '401': 'Not signed in',
  '402': 'Not in the lab’s plan',
  '403': 'Not allowed for this role',
  '404': 'Not found',
  '409': 'Clashes with what is there',
  '410': 'No longer there',
  '413': 'Too large',
  '415': 'Body of a kind not taken',
  '422': 'Cannot be worked out from this data',
  '429': 'Too many at once',
  '500': 'Fault on the server',
  '503': 'Unavailable for now',
};

/** The plain words for a status, or its class's when it has none of its own (`2XX`, an unusual code). */
export function statusWords(status: string): string {
  return (
    STATUS_WORDS[status] ?? { '1': 'Interim', '2': 'Success', '3': 'Sent on elsewhere', '4': 'Refused', '5': 'Fault on the server' }[status[0]] ?? 'Answer'
  );
}

/** "admins, technicians and scientists": the roles that hold a permission, in words. */
function rolesWith(permission: string): string {
  const roles = ROLES.filter((r) => (ROLE_PERMISSIONS[r] as readonly string[]).includes(permission as Permission)).map((r) => ROLE_LABELS[r].toLowerCase());
  if (roles.length === 0) return 'no role';
  return roles.length === 1 ? roles[0] : `${roles.slice(0, -1).join(', ')} and ${roles.at(-1)}`;
}

/** Who may call the operation and how they sign in, in one sentence. */
export function whoMayCall(op: OperationView): string {
  const how = op.auth.length ? op.auth.map((a) => AUTH_LABELS[a] ?? a).join(' or ') : null;
  if (!how) return 'Anyone: no sign-in needed.';
  const who = op.permission ? `Lab members whose role holds the permission ${op.permission} (${rolesWith(op.permission)})` : 'The caller';
  return `${who}, signed in with ${how}.`;
}

/** Every answer the operation documents: status with its plain meaning, then the document's description, media types and headers. */
function AnswerList({ answers, headingId }: { answers: AnswerView[]; headingId: string }) {
  return (
    <div className="grid min-w-0 gap-1">
      <h4 id={headingId} className="text-sm font-semibold">
        What comes back
      </h4>
      <dl aria-labelledby={headingId} className="grid gap-2 border-l-2 border-rule pl-3">
        {answers.map((a) => (
          <div key={a.status} className="grid min-w-0 gap-0.5" data-testid="api-answer" data-status={a.status}>
            <dt className="text-sm">
              <span className="font-mono font-semibold">{a.status}</span> <span className="text-ink-soft">{statusWords(a.status)}</span>
            </dt>
            <dd className="text-sm break-words">
              <WithCode text={a.description} />
              {(a.mediaTypes.length > 0 || a.headers.length > 0) && (
                <span className="text-ink-soft"> Sent as {[...a.mediaTypes, ...a.headers.map((h) => `header ${h}`)].join('; ')}.</span>
              )}
            </dd>
          </div>
        ))}
      </dl>
    </div>
  );
}

/** What the operation's disclosure holds, e.g. "What it takes (3 fields), 6 possible answers and an example". */
function detailsLabel(op: OperationView): string {
  const fields = op.pathParams.length + op.queryParams.length + (op.body?.fields.length ?? 0);
  const takes = fields === 0 ? 'Takes no fields' : `What it takes (${fields} ${fields === 1 ? 'field' : 'fields'})`;
  const answers = op.answers.length === 0 ? 'no documented answers' : `${op.answers.length} possible ${op.answers.length === 1 ? 'answer' : 'answers'}`;
  return `${takes}, ${answers} and an example`;
}

/**
 * One operation, read top to bottom: a plain title, the method and path as one line of
 * monospace text, what it does and who may call it; then, behind one plain disclosure (so the
 * page of some 80 operations stays short enough to scan, also on a phone), what it takes, what
 * comes back and an example request to copy.
 */
export function OperationEntry({ op }: { op: OperationView }) {
  const example = requestExample(op);
  return (
    <article aria-labelledby={`op-${op.id}`} className="grid min-w-0 gap-3 border-t border-rule pt-4" data-testid="api-operation">
      <h3 id={`op-${op.id}`} className="text-lg font-semibold">
        {op.title}
      </h3>
      <p className="font-mono text-sm break-all" data-testid="api-request-line">
        <span className="font-semibold">{op.method.toUpperCase()}</span> {op.path}
      </p>
      {op.summary && (
        <p className="text-sm">
          <WithCode text={op.summary} />
        </p>
      )}
      <p className="text-sm text-ink-soft" data-testid="api-who">
        {whoMayCall(op)}
      </p>
      <details className="group grid min-w-0 gap-3" data-testid="api-details">
        <summary className="cursor-pointer py-2 text-sm font-medium text-lichen-dark underline underline-offset-2">{detailsLabel(op)}</summary>
        <div className="grid min-w-0 gap-3 pt-1">
          {op.pathParams.length > 0 && <FieldList title="In the path" rows={op.pathParams} />}
          {op.queryParams.length > 0 && <FieldList title="In the query" rows={op.queryParams} />}
          {op.body && <FieldList title={`In the body (${op.body.mediaType})`} rows={op.body.fields} />}
          {op.answers.length > 0 && <AnswerList answers={op.answers} headingId={`op-${op.id}-answers`} />}
          <div className="grid min-w-0 gap-1">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h4 className="text-sm font-semibold">Example request</h4>
              <CopyButton text={example} what={`the example request of “${op.title}”`} />
            </div>
            <pre className="max-w-full overflow-x-auto rounded-lg bg-paper p-3 font-mono text-xs" data-testid="api-example">
              {example}
            </pre>
          </div>
        </div>
      </details>
    </article>
  );
}
