import { useMemo } from 'react';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { OPENAPI_URL, useOpenApi } from '../api/get-openapi.ts';
import { groupOperations } from './api-outline.ts';
import { FieldList } from './field-list.tsx';
import { AUTH_LABELS, OperationEntry } from './operation-entry.tsx';
import type { OpenApiDocument } from './openapi-types.ts';
import { schemaFields } from './schema-fields.ts';
import { WithCode } from './with-code.tsx';

/** The document's ways of signing in, with what each is for. */
function SigningIn({ doc }: { doc: OpenApiDocument }) {
  const schemes = Object.entries(doc.components?.securitySchemes ?? {});
  if (!schemes.length) return null;
  return (
    <section aria-labelledby="api-auth-heading" className="grid min-w-0 gap-2">
      <h2 id="api-auth-heading" className="text-xl font-semibold">
        Signing in
      </h2>
      <dl className="grid gap-3">
        {schemes.map(([name, s]) => (
          <div key={name} className="grid min-w-0 gap-0.5">
            <dt className="font-medium first-letter:uppercase">{AUTH_LABELS[name] ?? name}</dt>
            <dd className="text-sm">
              {s.description && <WithCode text={s.description} />}
              {s.bearerFormat && <span className="block font-mono text-xs break-all text-ink-soft">Bearer {s.bearerFormat}</span>}
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

/** The body every refusal carries (components.schemas.Error), so each operation need not repeat it. */
function Refusals({ doc }: { doc: OpenApiDocument }) {
  const error = doc.components?.schemas?.Error;
  if (!error) return null;
  return (
    <section aria-labelledby="api-refusals-heading" className="grid min-w-0 gap-2">
      <h2 id="api-refusals-heading" className="text-xl font-semibold">
        When a request is refused
      </h2>
      <p className="text-sm">Every answer from 400 up carries the same JSON body; programs branch on the code, people read the message.</p>
      <FieldList title="The refusal body" rows={schemaFields(error, doc)} />
    </section>
  );
}

/** The reference itself, from a loaded document (rendered separately so tests can hand one in). */
export function ApiReferenceView({ doc, origin }: { doc: OpenApiDocument; origin: string }) {
  const groups = useMemo(() => groupOperations(doc), [doc]);
  const count = groups.reduce((n, g) => n + g.operations.length, 0);
  return (
    <div className="grid min-w-0 gap-8">
      <header className="grid gap-2">
        <h1 className="text-3xl font-semibold">{doc.info.title}</h1>
        {doc.info.summary && <p className="text-lg">{doc.info.summary}</p>}
        {doc.info.description && (
          <p className="max-w-3xl text-sm text-ink-soft">
            <WithCode text={doc.info.description} />
          </p>
        )}
        <p className="text-sm break-words">
          Version {doc.info.version}, {count} operations. Requests go to <span className="font-mono break-all">{doc.servers?.[0]?.url ?? origin}</span>. The
          same reference for programs (OpenAPI {doc.openapi}):{' '}
          <a href={OPENAPI_URL} className="font-mono break-all text-lichen-dark underline underline-offset-2">
            {OPENAPI_URL}
          </a>
        </p>
      </header>
      <nav aria-label="API sections" className="grid gap-1 border-l-4 border-lichen pl-4">
        <p className="text-sm font-semibold">What do you want to do?</p>
        <ol className="grid gap-1 text-sm">
          {groups.map((g) => (
            <li key={g.id}>
              <a href={`#api-${g.id}`} className="inline-block py-1 text-lichen-dark underline underline-offset-2">
                {g.name}
              </a>{' '}
              <span className="text-ink-soft">— {g.operations.length} operations</span>
            </li>
          ))}
        </ol>
      </nav>
      <SigningIn doc={doc} />
      {groups.map((g) => (
        <section key={g.id} id={`api-${g.id}`} aria-labelledby={`api-${g.id}-heading`} className="grid min-w-0 gap-4" data-testid="api-task">
          <div className="grid gap-1">
            <h2 id={`api-${g.id}-heading`} className="text-xl font-semibold">
              {g.name}
            </h2>
            <p className="text-sm text-ink-soft">{g.intro}</p>
          </div>
          {g.operations.map((op) => (
            <OperationEntry key={`${op.method} ${op.path}`} op={op} />
          ))}
        </section>
      ))}
      <Refusals doc={doc} />
    </div>
  );
}

/** Lagbook's API reference page: fetches the server's OpenAPI document and lays it out by what a person wants to do. */
export function ApiReference({ origin }: { origin: string }) {
  const doc = useOpenApi();
  if (doc.isPending) return <LoadingNote what="Loading the API document…" />;
  if (doc.isError) return <Notice tone="alert">{doc.error.message}</Notice>;
  return <ApiReferenceView doc={doc.data} origin={origin} />;
}
