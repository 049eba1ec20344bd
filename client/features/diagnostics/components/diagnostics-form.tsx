import { useState, type FormEvent } from 'react';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { toZonedInput } from '../../../components/clock/format.ts';
import { DateTimeInput } from '../../../components/date-time-input.tsx';
import { readDateTime } from '../../../components/date-time-input-read.ts';
import type { DiagnosticsParams } from '@shared/contract/diagnostics.ts';
import { AggregateSelect, FormFooter } from './form-parts.tsx';

/** The form's fields as typed (strings until submitted). */
interface Draft {
  useChartRange: boolean;
  from: string;
  to: string;
  step: string;
  agg: DiagnosticsParams['agg'];
  difference: string;
  seasonalDifference: string;
  maxLag: string;
  periodMode: 'auto' | 'manual' | 'none';
  period: string;
  decomposition: DiagnosticsParams['decomposition'];
  alpha: string;
}

const whole = (s: string) => (/^\d+$/.test(s.trim()) ? Number(s.trim()) : NaN);

/**
 * Turns the draft into request parameters, or a `field: reason` message. The checks mirror the
 * server's schema so a mistake is caught before a request; the server checks again.
 */
export function paramsFromDraft(d: Draft, chartRange: { from: number; to: number }, timezone: string): DiagnosticsParams | string {
  let range = chartRange;
  if (!d.useChartRange) {
    const from = readDateTime(d.from, timezone);
    if (!from.ok) return `From: ${from.problem}`;
    const to = readDateTime(d.to, timezone);
    if (!to.ok) return `To: ${to.problem}`;
    range = { from: from.ms, to: to.ms };
  }
  if (range.from >= range.to) return 'Range: “to” must be after “from”';
  const step = d.step.trim() === '' ? undefined : whole(d.step);
  if (step !== undefined && !(step >= 1 && step <= 2_678_400)) return 'Resampling step: a whole number of seconds from 1 to 2678400';
  const maxLag = d.maxLag.trim() === '' ? undefined : whole(d.maxLag);
  if (maxLag !== undefined && !(maxLag >= 1 && maxLag <= 10_000)) return 'Max lag: a whole number from 1 to 10000';
  let period: DiagnosticsParams['period'] = d.periodMode === 'manual' ? whole(d.period) : d.periodMode;
  if (typeof period === 'number' && !(period >= 2 && period <= 100_000)) return 'Seasonal period: a whole number of steps from 2 to 100000';
  if (d.seasonalDifference !== '0' && period === 'none') return 'Seasonal differencing: needs a seasonal period (auto or manual)';
  const alpha = Number(d.alpha);
  if (!(alpha > 0 && alpha <= 0.5)) return 'α: a number above 0 and at most 0.5';
  period = period as DiagnosticsParams['period'];
  return {
    from: range.from,
    to: range.to,
    ...(step !== undefined ? { step } : {}),
    agg: d.agg,
    difference: Number(d.difference),
    seasonalDifference: Number(d.seasonalDifference),
    ...(maxLag !== undefined ? { maxLag } : {}),
    period,
    decomposition: d.decomposition,
    alpha,
  };
}

/**
 * The diagnostics parameters: range (the chart's by default), resampling step and aggregate,
 * differencing, max lag, seasonal period (auto, manual or none), decomposition and α. Empty
 * optional fields take the server's defaults, which the results' "Method" block then states.
 */
export function DiagnosticsForm({
  chartRange,
  timezone,
  running,
  onRun,
}: {
  chartRange: { from: number; to: number };
  timezone: string;
  running: boolean;
  onRun: (params: DiagnosticsParams) => void;
}) {
  const [d, setD] = useState<Draft>({
    useChartRange: true,
    from: toZonedInput(chartRange.from, timezone),
    to: toZonedInput(chartRange.to, timezone),
    step: '',
    agg: 'mean',
    difference: '0',
    seasonalDifference: '0',
    maxLag: '',
    periodMode: 'auto',
    period: '',
    decomposition: 'stl',
    alpha: '0.05',
  });
  const [error, setError] = useState<string | null>(null);
  const set = <K extends keyof Draft>(k: K, v: Draft[K]) => setD((old) => ({ ...old, [k]: v }));

  function submit(e: FormEvent) {
    e.preventDefault();
    const params = paramsFromDraft(d, chartRange, timezone);
    if (typeof params === 'string') return setError(params);
    setError(null);
    onRun(params);
  }

  return (
    <form aria-label="Diagnostics parameters" onSubmit={submit} className="grid gap-4">
      <fieldset className="grid gap-2">
        <legend className="text-sm font-semibold">Range</legend>
        <label className="inline-flex items-center gap-2 text-sm">
          <input type="checkbox" checked={d.useChartRange} onChange={(e) => set('useChartRange', e.target.checked)} className="h-4 w-4 accent-lichen" />
          Same range as the chart
        </label>
        {!d.useChartRange && (
          <div className="grid gap-3 sm:grid-cols-2">
            <DateTimeInput label="From" value={d.from} onChange={(v) => set('from', v)} timeZone={timezone} />
            <DateTimeInput label="To" value={d.to} onChange={(v) => set('to', v)} timeZone={timezone} />
          </div>
        )}
      </fieldset>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <TextField
          label="Resampling step (s)"
          inputMode="numeric"
          placeholder="channel interval"
          hint="Empty: the channel’s expected interval."
          value={d.step}
          onChange={(e) => set('step', e.target.value)}
        />
        <AggregateSelect value={d.agg} onChange={(agg) => set('agg', agg)} />
        <SelectField label="Differencing" value={d.difference} onChange={(e) => set('difference', e.target.value)}>
          <option value="0">none</option>
          <option value="1">once (lag 1)</option>
          <option value="2">twice (lag 1)</option>
        </SelectField>
        <SelectField label="Seasonal differencing" value={d.seasonalDifference} onChange={(e) => set('seasonalDifference', e.target.value)}>
          <option value="0">none</option>
          <option value="1">once (lag = period)</option>
        </SelectField>
        <TextField
          label="Max lag"
          inputMode="numeric"
          placeholder="auto"
          hint="Empty: 10·log10(n), raised to two periods."
          value={d.maxLag}
          onChange={(e) => set('maxLag', e.target.value)}
        />
        <SelectField label="Seasonal period" value={d.periodMode} onChange={(e) => set('periodMode', e.target.value as Draft['periodMode'])}>
          <option value="auto">detect automatically</option>
          <option value="manual">set by hand</option>
          <option value="none">no season</option>
        </SelectField>
        {d.periodMode === 'manual' && <TextField label="Period (steps)" inputMode="numeric" value={d.period} onChange={(e) => set('period', e.target.value)} />}
        <SelectField label="Decomposition" value={d.decomposition} onChange={(e) => set('decomposition', e.target.value as Draft['decomposition'])}>
          <option value="stl">STL</option>
          <option value="stl-robust">STL, robust</option>
          <option value="classical">classical (additive)</option>
          <option value="none">none</option>
        </SelectField>
        <TextField label="α (1 − confidence)" inputMode="decimal" value={d.alpha} onChange={(e) => set('alpha', e.target.value)} />
      </div>
      <FormFooter error={error} submitLabel="Analyse" running={running} />
    </form>
  );
}
