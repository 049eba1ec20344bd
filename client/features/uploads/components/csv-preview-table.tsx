import type { CsvPreview } from '../hooks/csv-preview.ts';

/** The first rows of the chosen file as the import will read them, so the mapping can be checked by eye. */
export function CsvPreviewTable({ preview, fileName }: { preview: CsvPreview; fileName: string }) {
  return (
    <div className="overflow-x-auto rounded-xl border border-rule bg-card" tabIndex={0}>
      <table className="w-full border-collapse text-left font-mono text-xs">
        <caption className="px-4 py-2 text-left font-sans text-sm text-ink-soft">
          First {preview.rows.length} rows of {fileName}
        </caption>
        <thead className="border-b border-rule bg-paper/60">
          <tr>
            {preview.header.map((h, i) => (
              <th key={i} scope="col" className="px-3 py-2 font-semibold">
                {h || <span className="text-ink-soft">(column {i + 1})</span>}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((row, r) => (
            <tr key={r} className="border-b border-rule/70 last:border-b-0">
              {preview.header.map((_, c) => (
                <td key={c} className="whitespace-nowrap px-3 py-1.5">
                  {row[c] ?? ''}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
