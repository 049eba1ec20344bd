import { regularize } from '../../../analysis/index.ts';
import type { LabScope } from '../../../db/tenant-scope.ts';
import type { ProjectedStep, StoredProjection } from '../../../db/alerts.repo.ts';
import { channelReadingsRepo } from '../../../db/channel-readings.repo.ts';
import type { EarlyWarningParams } from '../../../contract/alerts.ts';
import { durationWords } from '../rules/rule-step.ts';
import { warningGrid } from './early-warning-grid.ts';
import { fillForDecomposition } from './fill-for-decomposition.ts';
import { findCycle } from './find-cycle.ts';
import { projectCrossing, ProjectionRefusal, type ProjectedLimit } from './project-crossing.ts';

/**
 * The projection of one rule's channel (the limit with the highest chance), or why there is none;
 * with the newest reading's value (null when none was read).
 */
export type RuleProjection = ({ projection: StoredProjection; notProjected: null } | { projection: null; notProjected: NotProjected }) & {
  newestValue: number | null;
};

/**
 * Why a rule's channel could not be projected: the reasons of rule health where they apply
 * ('no-readings', 'logger-silent', 'too-little-history', 'too-many-gaps'), and 'no-model' when no
 * steady model fits the recent readings; with one sentence for people.
 */
export interface NotProjected {
  reason: 'no-readings' | 'logger-silent' | 'too-little-history' | 'too-many-gaps' | 'no-model';
  detail: string;
}

/** What the projection needs of the rule and its channel. */
export interface ProjectionSubject {
  channelId: number;
  expectedIntervalS: number;
  lastReadingTs: number | null;
  low: number | null;
  high: number | null;
  earlyWarning: EarlyWarningParams;
  /** The channel's unit, stored with the projection so every number it shows carries it. */
  unit: string;
}

/**
 * Reads a channel's recent readings onto the projection's grid ({@link warningGrid}; the mean of
 * each cell) and projects them ({@link projectCrossing}, the cycle found by the period search)
 * against the rule's limits; keeps the limit with the highest chance. No projection when the
 * channel has no reading, when its newest is older than the horizon (the projection would start
 * from a stale state), or when the projection refuses (too little history, too many gaps, no
 * steady model). Reads only; writes nothing.
 */
export async function projectForRule(scope: LabScope, s: ProjectionSubject, now: number): Promise<RuleProjection> {
  const { horizonMin } = s.earlyWarning;
  if (s.lastReadingTs === null)
    return { projection: null, notProjected: { reason: 'no-readings', detail: 'the channel has no readings yet' }, newestValue: null };
  if (now - s.lastReadingTs > horizonMin * 60_000) {
    return {
      projection: null,
      notProjected: { reason: 'logger-silent', detail: `the channel has had no reading for ${durationWords(now - s.lastReadingTs)}` },
      newestValue: null,
    };
  }
  const grid = warningGrid(s.expectedIntervalS, horizonMin);
  const to = s.lastReadingTs + 1;
  const from = to - grid.historyMs;
  const read = await channelReadingsRepo(scope).rangeForGrid(s.channelId, from, to, grid.stepMs);
  if (read.ts.length === 0)
    return { projection: null, notProjected: { reason: 'no-readings', detail: 'the channel has no recent readings' }, newestValue: null };
  const newestValue = read.values[read.values.length - 1];
  const cells = regularize(read.ts, read.values, { step: grid.stepMs, agg: 'mean' });
  const filled = fillForDecomposition(cells.values, null);
  const period = filled ? findCycle(filled.values, grid.stepMs) : null;
  const limits: ProjectedLimit[] = [];
  if (s.high !== null) limits.push({ limit: s.high, side: 'high' });
  if (s.low !== null) limits.push({ limit: s.low, side: 'low' });
  const lastAt = cells.start + (cells.values.length - 1) * grid.stepMs;
  try {
    const p = projectCrossing({ values: cells.values, lastAt, stepMs: grid.stepMs, limits, horizonSteps: grid.horizonSteps, period });
    const likeliest = p.crossings.reduce((a, b) => (b.chance > a.chance ? b : a));
    const h = grid.horizonSteps;
    const path: ProjectedStep[] = Array.from({ length: h }, (_, k) => ({
      at: s.lastReadingTs! + (k + 1) * grid.stepMs,
      mean: p.mean[k],
      lower: p.lower[k],
      upper: p.upper[k],
    }));
    return {
      notProjected: null,
      newestValue,
      projection: {
        model: p.model,
        limit: likeliest.limit,
        side: likeliest.side,
        horizonMin,
        chance: likeliest.chance,
        medianMinutesToCross: likeliest.medianStepsToCross === null ? null : Math.round((likeliest.medianStepsToCross * grid.stepMs) / 60_000),
        interval: { level: p.level, lower: p.lower[h - 1], upper: p.upper[h - 1] },
        from: s.lastReadingTs,
        unit: s.unit,
        path,
      },
    };
  } catch (err) {
    if (err instanceof ProjectionRefusal) return { projection: null, notProjected: { reason: err.reason, detail: err.message }, newestValue };
    throw err;
  }
}
