import type { FieldRow } from './schema-fields.ts';

/** Parameters or body fields of an operation: name, type, required, rules and what it is. */
export function FieldsTable({ caption, rows }: { caption: string; rows: FieldRow[] }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="pb-1 text-left text-xs font-semibold uppercase tracking-wide text-ink-soft">{caption}</caption>
        <thead className="sr-only">
          <tr>
            <th scope="col">Name</th>
            <th scope="col">Type</th>
            <th scope="col">Required</th>
            <th scope="col">Rules and meaning</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.name} className="border-t border-rule/70 align-top">
              <th scope="row" className="py-1.5 pr-3 font-mono text-xs font-medium whitespace-nowrap">
                {row.name}
              </th>
              <td className="py-1.5 pr-3 text-xs text-lichen-dark whitespace-nowrap">{row.type}</td>
              <td className="py-1.5 pr-3 text-xs whitespace-nowrap">
                {row.required ? <strong>required</strong> : <span className="text-ink-soft">optional</span>}
              </td>
              <td className="py-1.5 text-xs">
                {row.description && <span>{row.description}. </span>}
                {row.constraints.length > 0 && <span className="text-ink-soft">{row.constraints.join('; ')}</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
