import { useMemo } from 'react';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { OPENAPI_URL, useOpenApi } from '../api/get-openapi.ts';
import { groupOperations } from './api-outline.ts';
import { AUTH_LABELS, OperationCard } from './operation-card.tsx';
import type { OpenApiDocument } from './openapi-types.ts';
import { WithCode } from './with-code.tsx';

/** The document's ways of signing in, with what each is for. */
function AuthSchemes({ doc }: { doc: OpenApiDocument }) {
  const schemes = Object.entries(doc.components?.securitySchemes ?? {});
  if (!schemes.length) return null;
  return (
    <section aria-labelledby="api-auth-heading" className="grid gap-2">
      <h2 id="api-auth-heading" className="text-lg font-semibold">
        Signing in
      </h2>
      <dl className="grid gap-2 text-sm sm:grid-cols-[12rem_1fr]">
        {schemes.map(([name, s]) => (
          <div key={name} className="contents">
            <dt className="font-medium">
              {AUTH_LABELS[name] ?? name}
              {s.bearerFormat && <span className="block font-mono text-xs text-ink-soft">Bearer {s.bearerFormat}</span>}
            </dt>
            <dd className="text-ink-soft">{s.description && <WithCode text={s.description} />}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

/** The reference itself, from a loaded document (rendered separately so tests can hand one in). */
export function ApiReferenceView({ doc, origin }: { doc: OpenApiDocument; origin: string }) {
  const groups = useMemo(() => groupOperations(doc), [doc]);
  const count = groups.reduce((n, g) => n + g.operations.length, 0);
  return (
    <div className="grid gap-8">
      <header className="grid gap-2">
        <p className="text-sm font-medium uppercase tracking-wide text-ink-soft">Reference · version {doc.info.version}</p>
        <h1 className="text-3xl font-semibold">{doc.info.title}</h1>
        {doc.info.summary && <p className="text-lg">{doc.info.summary}</p>}
        {doc.info.description && (
          <p className="max-w-3xl text-sm text-ink-soft">
            <WithCode text={doc.info.description} />
          </p>
        )}
        <p className="text-sm">
          {count} operations. Base address <span className="font-mono">{doc.servers?.[0]?.url ?? origin}</span>. The machine-readable document (OpenAPI{' '}
          {doc.openapi}):{' '}
          <a href={OPENAPI_URL} className="font-mono text-lichen-dark underline underline-offset-2">
            {OPENAPI_URL}
          </a>
        </p>
      </header>
      <AuthSchemes doc={doc} />
      <nav aria-label="API sections" className="flex flex-wrap gap-2 text-sm">
        {groups.map((g) => (
          <a key={g.name} href={`#api-${g.name}`} className="rounded-full border border-rule bg-card px-3 py-1 hover:border-lichen">
            {g.name} <span className="text-ink-soft">({g.operations.length})</span>
          </a>
        ))}
      </nav>
      {groups.map((g) => (
        <section key={g.name} id={`api-${g.name}`} aria-labelledby={`api-${g.name}-heading`} className="grid gap-3">
          <h2 id={`api-${g.name}-heading`} className="border-b border-rule pb-1 text-xl font-semibold capitalize">
            {g.name}
          </h2>
          {g.operations.map((op) => (
            <OperationCard key={`${op.method} ${op.path}`} op={op} />
          ))}
        </section>
      ))}
    </div>
  );
}

/** Lagbook's API reference page: fetches the server's OpenAPI document and lays it out by section. */
export function ApiReference({ origin }: { origin: string }) {
  const doc = useOpenApi();
  if (doc.isPending) return <LoadingNote what="Loading the API document…" />;
  if (doc.isError) return <Notice tone="alert">{doc.error.message}</Notice>;
  return <ApiReferenceView doc={doc.data} origin={origin} />;
}
