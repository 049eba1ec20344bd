import { useMemo, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { EChart } from '../../../components/charts/echart.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import type { CrossCorrelation } from '@shared/contract/diagnostics.ts';
import { useDiagnosticsRun } from '../hooks/use-diagnostics-run.ts';
import { subscript } from './arma-notation.ts';
import { fmtSeconds } from './format-number.ts';
import { lagTimeLabel, lagWindowSteps, type LagUnit } from './lag-window.ts';
import { RunProgress } from './run-progress.tsx';
import { lagsOutsideBand, stemChartOption, stemSummary } from './stem-chart-option.ts';
import { DIAGNOSTICS_MESSAGES } from '../messages.ts';

/** Another channel of the lab to compare with. */
export interface PartnerChannel {
  id: number;
  label: string;
  loggerName: string;
}

const X_NAME = 'Lag (time): the value at +k estimates cor(this[t + k], other[t])';

/**
 * The strongest lag as plain facts (steps, time, r, both bands, pairs). The sentence that
 * interprets it, with the sign convention, is the server's `explanation`.
 */
export function strongestLagFacts(ccf: CrossCorrelation): string {
  const s = ccf.strongest;
  if (!s) return DIAGNOSTICS_MESSAGES.noLag;
  const span = s.lag === 0 ? 'no shift' : `${s.lag > 0 ? '+' : '−'}${fmtSeconds(Math.abs(s.lagMs) / 1000)}`;
  const verdict = s.significant ? 'beyond the band over all lags' : 'inside the band over all lags';
  return `Strongest at lag ${s.lag} steps (${span}), r = ${s.value.toFixed(3)}, ${verdict}; band ±${ccf.band.toFixed(3)} per lag, ±${ccf.simultaneousBand.toFixed(3)} over all lags (${ccf.simultaneousMethod}); ${ccf.pairs.toLocaleString('en')} paired steps. Positive lags mean this channel follows ${ccf.with.label}.`;
}

/** How the CCF was computed, in words: the partner's AR filter applied to both series, or why it is the raw CCF. */
export function prewhiteningStatement(ccf: CrossCorrelation): string {
  const f = ccf.prewhitening;
  if (ccf.method === 'raw' || !f) return DIAGNOSTICS_MESSAGES.rawNotATest;
  const coefs = f.coefficients.map((c, i) => `φ${subscript(i + 1)} = ${c.toFixed(3)}`).join(', ');
  return `Prewhitened: both series were filtered with the AR(${f.order}) model fitted to ${ccf.with.label}${coefs ? ` (${coefs})` : ''}, so the persistence of either series cannot make a relation appear.`;
}

/**
 * Cross-correlation of this channel with another of the lab over the chart's range. The server
 * prewhitens by default (the partner's AR filter applied to both series; Box, Jenkins, Reinsel &
 * Ljung 2015, ch. 12): that CCF is drawn with the per-lag band and the band over all lags; the
 * raw CCF can be shown beside it, labelled as no test. The lag window is typed in time units and
 * sent in steps of the channel's interval (`stepS`).
 */
export function CrossCorrelationPanel({
  slug,
  channelId,
  channelLabel,
  chartRange,
  partners,
  stepS,
}: {
  slug: string;
  channelId: number;
  channelLabel: string;
  chartRange: { from: number; to: number };
  partners: PartnerChannel[];
  /** The channel's expected interval in seconds: the grid step the server uses by default. */
  stepS: number;
}) {
  const run = useDiagnosticsRun(slug, channelId);
  const [partner, setPartner] = useState(partners[0]?.id ?? 0);
  const [difference, setDifference] = useState('0');
  const [lagWindow, setLagWindow] = useState('');
  const [windowUnit, setWindowUnit] = useState<LagUnit>('h');
  const [formError, setFormError] = useState<string | null>(null);
  const [showRaw, setShowRaw] = useState(false);
  const report = run.running ? null : (run.query.data ?? null);
  const ccf = report?.crossCorrelation ?? null;
  const stepMs = report?.series.stepMs ?? stepS * 1000;
  const lagLabel = (k: number) => lagTimeLabel(k, stepMs);
  const prewhitened = ccf?.method === 'prewhitened';
  const option = useMemo(
    () =>
      ccf
        ? stemChartOption({
            name: prewhitened ? 'Prewhitened CCF' : 'Raw CCF',
            lags: ccf.lags,
            values: ccf.values,
            whiteNoise: ccf.band,
            whiteNoiseLabel: 'Band per lag ±z/√pairs',
            simultaneous: { halfWidth: ccf.simultaneousBand, label: `Band over all lags (${ccf.simultaneousMethod})` },
            highlightLag: ccf.strongest?.lag ?? null,
            lagLabel: (k) => lagTimeLabel(k, stepMs),
            xName: X_NAME,
          })
        : null,
    [ccf, prewhitened, stepMs],
  );
  const rawOption = useMemo(
    () =>
      ccf && showRaw
        ? stemChartOption({
            name: 'Raw CCF',
            lags: ccf.raw.lags,
            values: ccf.raw.values,
            whiteNoise: ccf.raw.band,
            whiteNoiseLabel: 'Band per lag ±z/√pairs (valid only for white noise)',
            highlightLag: ccf.raw.strongest?.lag ?? null,
            lagLabel: (k) => lagTimeLabel(k, stepMs),
            xName: X_NAME,
          })
        : null,
    [ccf, showRaw, stepMs],
  );

  function submit(e: FormEvent) {
    e.preventDefault();
    if (!partner) return;
    const ccfMaxLag = lagWindowSteps(lagWindow, windowUnit, stepS);
    if (typeof ccfMaxLag === 'string') return setFormError(ccfMaxLag);
    setFormError(null);
    run.run({
      ...chartRange,
      agg: 'mean',
      difference: Number(difference),
      seasonalDifference: 0,
      period: 'none',
      decomposition: 'none',
      alpha: 0.05,
      ccfWith: partner,
      ...(ccfMaxLag !== undefined ? { ccfMaxLag } : {}),
    });
  }

  const title = `${prewhitened ? 'Prewhitened cross-correlation' : 'Raw cross-correlation'} of ${channelLabel} with ${ccf?.with.label ?? ''}`;
  return (
    <section aria-labelledby="ccf-heading" className="grid gap-4 rounded-xl border border-rule bg-card p-4">
      <h3 id="ccf-heading" className="text-lg font-semibold">
        Cross-correlation
      </h3>
      {partners.length === 0 ? (
        <p className="text-sm text-ink-soft">The lab has no other channel to compare with.</p>
      ) : (
        <form aria-label="Cross-correlation parameters" onSubmit={submit} className="grid gap-2">
          <div className="flex flex-wrap items-end gap-3">
            <div className="min-w-64">
              <SelectField label="Compare with" value={partner} onChange={(e) => setPartner(Number(e.target.value))}>
                {partners.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.label} — {p.loggerName}
                  </option>
                ))}
              </SelectField>
            </div>
            <SelectField label="Differencing (both)" value={difference} onChange={(e) => setDifference(e.target.value)}>
              <option value="0">none</option>
              <option value="1">once</option>
            </SelectField>
            <div className="w-28">
              <TextField label="Lag window ±" inputMode="decimal" placeholder="auto" value={lagWindow} onChange={(e) => setLagWindow(e.target.value)} />
            </div>
            <SelectField label="Lag window unit" value={windowUnit} onChange={(e) => setWindowUnit(e.target.value as LagUnit)}>
              <option value="min">minutes</option>
              <option value="h">hours</option>
              <option value="d">days</option>
            </SelectField>
            <Button type="submit" tone="primary" disabled={run.running}>
              Cross-correlate
            </Button>
          </div>
          <p className="text-xs text-ink-soft">
            Lag window empty: at least 12 hours or a quarter of the range, whichever is shorter. Lags are whole steps of {fmtSeconds(stepS)}.
          </p>
          {formError && (
            <p role="alert" className="text-sm text-alert">
              {formError}
            </p>
          )}
        </form>
      )}
      {run.running && <RunProgress what="Cross-correlating" elapsed={run.elapsed} onCancel={run.cancel} />}
      {run.query.isError && <Notice tone="alert">{run.query.error.message}</Notice>}
      {ccf && option && (
        <div className="grid gap-2" data-testid="ccf-result">
          <p className="font-medium" data-testid="ccf-sentence">
            {ccf.explanation}
          </p>
          <p className="text-sm" data-testid="ccf-method">
            {prewhiteningStatement(ccf)}
          </p>
          <p className="text-sm text-ink-soft" data-testid="ccf-facts">
            {strongestLagFacts(ccf)}
          </p>
          <EChart
            option={option}
            label={title}
            summary={stemSummary(
              prewhitened ? 'Prewhitened CCF' : 'Raw CCF',
              lagsOutsideBand(ccf.lags, ccf.values, () => ccf.simultaneousBand),
              `band over all lags ±${ccf.simultaneousBand.toFixed(3)}`,
            )}
            pngName={`${slug}-ccf-${channelId}-${ccf.with.id}`}
          />
          {prewhitened && (
            <label className="inline-flex items-center gap-2 text-sm">
              <input type="checkbox" checked={showRaw} onChange={(e) => setShowRaw(e.target.checked)} className="h-4 w-4 accent-lichen" />
              Show the raw cross-correlation beside it
            </label>
          )}
          {rawOption && (
            <div className="rounded-lg border border-rule bg-paper p-3" data-testid="ccf-raw">
              <p className="text-sm font-medium">Raw cross-correlation — not a test of a relation between autocorrelated series</p>
              <p className="text-xs text-ink-soft">
                Both series as logged, without the filter. When either series carries over from one step to the next, its band ±{ccf.raw.band.toFixed(3)} is far
                too narrow and peaks appear where there is no relation. Shown for comparison only.
              </p>
              <EChart
                option={rawOption}
                label={`Raw cross-correlation of ${channelLabel} with ${ccf.with.label} (not a test)`}
                summary={
                  ccf.raw.strongest
                    ? `Raw CCF: largest at ${lagLabel(ccf.raw.strongest.lag)} (lag ${ccf.raw.strongest.lag}), r = ${ccf.raw.strongest.value.toFixed(3)}; not evidence of a relation.`
                    : DIAGNOSTICS_MESSAGES.rawNoLag
                }
                pngName={`${slug}-ccf-raw-${channelId}-${ccf.with.id}`}
              />
            </div>
          )}
        </div>
      )}
    </section>
  );
}
