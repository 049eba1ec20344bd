import type { DiagnosticsReport, StlSettings } from '@shared/contract/diagnostics.ts';
import { formatInstant } from '../../../components/clock/format.ts';
import { methodRows } from './method-rows.ts';
import { stlSettingRows } from './stl-settings.ts';

/**
 * Exactly what was computed, as the server reports it: the resolved parameters in plain words
 * with their units (times on the clock of `timezone`), the steps taken with the data and the
 * published methods, so a figure can be reproduced and cited.
 */
export function MethodBlock({ method, cached, timezone }: { method: DiagnosticsReport['method']; cached: boolean; timezone: string }) {
  const r = method.resolved;
  return (
    <section aria-labelledby="method-heading" className="grid gap-2 text-sm">
      <h4 id="method-heading" className="font-semibold">
        Method and parameters
      </h4>
      <dl className="grid gap-x-4 gap-y-0.5 text-xs sm:grid-cols-[auto_1fr]" data-testid="method-parameters">
        {methodRows(r, timezone).map((row) => (
          <div key={row.label} className="contents">
            <dt className="text-ink-soft">{row.label}</dt>
            <dd className="break-words">{row.value}</dd>
          </div>
        ))}
      </dl>
      {r.stl && <StlSettingsList settings={r.stl} />}
      <ul className="list-disc pl-5">
        {method.notes.map((n) => (
          <li key={n}>{n}</li>
        ))}
      </ul>
      {method.excludedNotes.length > 0 && (
        <div className="grid gap-1">
          <p className="font-medium">Left out of the analysis (notes marked “leave out of analysis”)</p>
          <table className="text-xs">
            <thead className="text-left text-ink-soft">
              <tr>
                <th className="pr-3 font-normal">Kind</th>
                <th className="pr-3 font-normal">Span</th>
                <th className="pr-3 font-normal">Cells removed</th>
                <th className="font-normal">Note</th>
              </tr>
            </thead>
            <tbody>
              {method.excludedNotes.map((n) => (
                <tr key={`${n.id}-${n.removedFrom}`} data-testid="excluded-note">
                  <td className="pr-3">
                    {n.kind}
                    {n.channelId === null ? ' (whole logger)' : ''}
                  </td>
                  <td className="pr-3 font-mono">
                    {formatInstant(n.from, timezone)} – {formatInstant(n.to, timezone)}
                  </td>
                  <td className="pr-3 font-mono">{n.cellsRemoved}</td>
                  <td>{n.text}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <p className="font-medium">References</p>
      <ul className="list-disc pl-5 text-ink-soft">
        {method.references.map((n) => (
          <li key={n}>{n}</li>
        ))}
      </ul>
      <p className="text-xs text-ink-soft" data-testid="cached">
        {cached ? 'Served from the result cache (same data version and parameters).' : 'Computed for this request.'}
      </p>
    </section>
  );
}

/** The STL settings as run, in plain words with the symbols of Cleveland et al. (1990). */
function StlSettingsList({ settings }: { settings: StlSettings }) {
  return (
    <div className="grid gap-1" data-testid="stl-settings">
      <p className="font-medium">STL settings (symbols of Cleveland, Cleveland, McRae &amp; Terpenning 1990)</p>
      <dl className="grid gap-x-3 gap-y-0.5 text-xs sm:grid-cols-[auto_auto_1fr]">
        {stlSettingRows(settings).map((row) => (
          <div key={row.symbol} className="contents">
            <dt className="font-mono text-ink-soft">{row.symbol}</dt>
            <dt className="font-medium">{row.name}</dt>
            <dd>{row.value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
