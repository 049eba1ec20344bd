import { useId } from 'react';
import type { FieldRow } from './schema-fields.ts';

/**
 * Parameters or body fields of an operation as a definition list: each field's name and type
 * on one line with whether it must be sent, then what it is and its rules below. Stacks on a
 * narrow screen (no table to scroll sideways).
 */
export function FieldList({ title, rows }: { title: string; rows: FieldRow[] }) {
  const id = useId();
  return (
    <div className="grid min-w-0 gap-1">
      <h4 id={id} className="text-sm font-semibold">
        {title}
      </h4>
      <dl aria-labelledby={id} className="grid gap-2 border-l-2 border-rule pl-3">
        {rows.map((row) => (
          <div key={row.name} className="grid min-w-0 gap-0.5" data-testid="api-field">
            <dt className="flex flex-wrap items-baseline gap-x-2">
              <code className="font-mono text-sm font-semibold break-all">{row.name}</code>
              <span className="text-xs text-ink-soft">
                {row.type} · {row.required ? <strong className="text-ink">must be sent</strong> : 'may be left out'}
              </span>
            </dt>
            {(row.description || row.constraints.length > 0) && (
              <dd className="text-sm">
                {row.description && <span>{row.description}. </span>}
                {row.constraints.length > 0 && <span className="text-ink-soft">{row.constraints.join('; ')}.</span>}
              </dd>
            )}
          </div>
        ))}
      </dl>
    </div>
  );
}
