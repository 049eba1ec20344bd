import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { DateTimeInput } from '../../../components/date-time-input.tsx';
import type { ComparisonParams } from '@shared/contract/diagnostics.ts';
import { comparisonQueryOptions } from '../api/get-comparison.ts';
import { useAnalysisRun } from '../hooks/use-analysis-run.ts';
import { ComparisonResult } from './comparison-result.tsx';
import type { PartnerChannel } from './cross-correlation-panel.tsx';
import { comparisonParamsFromDraft, halvesDraft, type ComparisonDraft } from './range-comparison-form.ts';
import { AggregateSelect, FormFooter } from './form-parts.tsx';
import { RunProgress } from './run-progress.tsx';

type Times = Pick<ComparisonDraft, 'aFrom' | 'aTo' | 'bFrom' | 'bTo'>;

/** One range's two wall-clock times in the logger's zone. */
function RangeFieldset(props: {
  name: 'A' | 'B';
  channelLabel: string;
  timezone: string;
  from: string;
  to: string;
  onFrom: (v: string) => void;
  onTo: (v: string) => void;
}) {
  const { name, timezone } = props;
  return (
    <fieldset className="grid gap-2">
      <legend className="text-sm font-semibold">
        Range {name} — {props.channelLabel}
      </legend>
      <div className="grid gap-3 sm:grid-cols-2">
        <DateTimeInput label={`${name} from`} value={props.from} onChange={props.onFrom} timeZone={timezone} />
        <DateTimeInput label={`${name} to`} value={props.to} onChange={props.onTo} timeZone={timezone} />
      </div>
    </fieldset>
  );
}

/**
 * Before and after: the mean of range A of this channel against range B of this channel (or of
 * another channel of the lab), with an interval that allows for autocorrelation beside the naive
 * one. Until a time is edited, the ranges are the two halves of the chart's range.
 */
export function RangeComparisonPanel({
  slug,
  channelId,
  channelLabel,
  timezone,
  chartRange,
  partners,
}: {
  slug: string;
  channelId: number;
  channelLabel: string;
  timezone: string;
  chartRange: { from: number; to: number };
  partners: PartnerChannel[];
}) {
  const run = useAnalysisRun((params: ComparisonParams | null) => comparisonQueryOptions(slug, channelId, params));
  // null: follow the chart's range (its two halves); set once a time is typed
  const [times, setTimes] = useState<Times | null>(null);
  const [rest, setRest] = useState<Omit<ComparisonDraft, keyof Times>>({ other: '', step: '', agg: 'mean', alpha: '0.05' });
  const [error, setError] = useState<string | null>(null);
  const shown = times ?? halvesDraft(chartRange, timezone);
  const setTime = (k: keyof Times, v: string) => setTimes({ ...shown, [k]: v });
  const set = <K extends keyof typeof rest>(k: K, v: (typeof rest)[K]) => setRest((old) => ({ ...old, [k]: v }));
  const answer = run.running ? null : (run.query.data ?? null);

  function submit(e: FormEvent) {
    e.preventDefault();
    const params = comparisonParamsFromDraft({ ...shown, ...rest }, timezone);
    if (typeof params === 'string') return setError(params);
    setError(null);
    run.run(params);
  }

  const otherLabel = partners.find((p) => String(p.id) === rest.other)?.label ?? channelLabel;
  return (
    <section aria-labelledby="comparison-heading" className="grid gap-4 rounded-xl border border-rule bg-card p-4">
      <h3 id="comparison-heading" className="text-lg font-semibold">
        Before and after
      </h3>
      <p className="text-sm text-ink-soft">
        Did the mean change between two ranges — for example after a repair or a new setting? Range B may also be the same times on another channel.
      </p>
      <form aria-label="Comparison parameters" onSubmit={submit} className="grid gap-4">
        <div className="grid gap-4 lg:grid-cols-2">
          <RangeFieldset
            name="A"
            channelLabel={channelLabel}
            timezone={timezone}
            from={shown.aFrom}
            to={shown.aTo}
            onFrom={(v) => setTime('aFrom', v)}
            onTo={(v) => setTime('aTo', v)}
          />
          <RangeFieldset
            name="B"
            channelLabel={otherLabel}
            timezone={timezone}
            from={shown.bFrom}
            to={shown.bTo}
            onFrom={(v) => setTime('bFrom', v)}
            onTo={(v) => setTime('bTo', v)}
          />
        </div>
        <div className="flex flex-wrap gap-3 text-sm">
          <Button size="sm" tone="quiet" onClick={() => setTimes(null)}>
            Use the two halves of the chart’s range
          </Button>
          <Button size="sm" tone="quiet" onClick={() => setTimes({ ...shown, bFrom: shown.aFrom, bTo: shown.aTo })}>
            Give B the same times as A
          </Button>
        </div>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <SelectField label="Range B is of" value={rest.other} onChange={(e) => set('other', e.target.value)}>
            <option value="">this channel ({channelLabel})</option>
            {partners.map((p) => (
              <option key={p.id} value={p.id}>
                {p.label} — {p.loggerName}
              </option>
            ))}
          </SelectField>
          <TextField
            label="Resampling step (s)"
            inputMode="numeric"
            placeholder="channel interval"
            hint="Empty: the channel’s expected interval."
            value={rest.step}
            onChange={(e) => set('step', e.target.value)}
          />
          <AggregateSelect value={rest.agg} onChange={(agg) => set('agg', agg)} />
          <TextField label="α (1 − confidence)" inputMode="decimal" value={rest.alpha} onChange={(e) => set('alpha', e.target.value)} />
        </div>
        <FormFooter error={error} submitLabel="Compare" running={run.running} />
      </form>
      {run.running && <RunProgress what="Comparing" elapsed={run.elapsed} onCancel={run.cancel} />}
      {run.query.isError && <Notice tone="alert">{run.query.error.message}</Notice>}
      {answer && <ComparisonResult answer={answer} timezone={timezone} />}
    </section>
  );
}
