import type { LjungBoxRow } from '@shared/contract/diagnostics.ts';
import { fmtP, fmtStat } from './format-number.ts';

/** The Ljung–Box portmanteau tests (Ljung & Box 1978) at each lag the server ran, with the verdict at α. */
export function LjungBoxTable({ rows, alpha }: { rows: LjungBoxRow[]; alpha: number }) {
  return (
    <table className="w-full border-collapse text-left text-sm">
      <caption className="mb-1 text-left text-sm font-semibold">Ljung–Box tests (H₀: no autocorrelation up to the lag)</caption>
      <thead className="border-b border-rule text-xs uppercase tracking-wide text-ink-soft">
        <tr>
          <th scope="col" className="py-1 pr-3">
            Lag
          </th>
          <th scope="col" className="py-1 pr-3">
            Q
          </th>
          <th scope="col" className="py-1 pr-3">
            df
          </th>
          <th scope="col" className="py-1 pr-3">
            p-value
          </th>
          <th scope="col" className="py-1">
            At <span className="normal-case">α</span> = {alpha}
          </th>
        </tr>
      </thead>
      <tbody className="font-mono">
        {rows.map((r) => (
          <tr key={r.lag} className="border-b border-rule/60 last:border-b-0">
            <td className="py-1 pr-3">{r.lag}</td>
            <td className="py-1 pr-3">{fmtStat(r.statistic, 6)}</td>
            <td className="py-1 pr-3">{r.df}</td>
            <td className="py-1 pr-3">{fmtP(r.pValue)}</td>
            <td className="py-1 font-sans">{r.pValue < alpha ? 'autocorrelated' : 'no evidence'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
