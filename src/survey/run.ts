/** Survey planning on a pipeline result: proposals, per-line figures from sections, programme totals. */

import { gridOf } from '../derive/derive.js';
import { extentOf } from '../grid/geometry.js';
import type { Ring } from '../boundaries/planar.js';
import type { PipelineResult } from '../pipeline.js';
import { resolvePlan, type PlanParams } from './params.js';
import { planSurvey, type Plan } from './plan.js';
import { lineFigures, programmeFigures, type LineFigures, type ProgrammeFigures } from './programme.js';
import { sampleSection, type Section, type SectionGrids } from './section.js';
import type { UncertaintyResult } from '../uncertainty/summary.js';

/** The P90 and P10 taper and oceanic lines of a sweep, as the planner takes them. */
export function envelopeOf(u: UncertaintyResult): NonNullable<Parameters<typeof planSurvey>[0]['envelope']> {
  const get = (line: 'taper' | 'oceanic', p: 90 | 10) => u.lines.find((l) => l.line === line && l.p === p)?.rings ?? [];
  return { taper: { p90: get('taper', 90), p10: get('taper', 10) }, oceanic: { p90: get('oceanic', 90), p10: get('oceanic', 10) } };
}

export interface SurveyPlan {
  readonly params: PlanParams;
  readonly plan: Plan;
  readonly figures: Map<string, LineFigures>;
  readonly programme: ProgrammeFigures;
}

export function sectionGrids(r: PipelineResult): SectionGrids {
  return {
    geometry: r.geometry,
    seabed: r.analysis.seabed,
    basement: r.analysis.basement,
    moho: r.analysis.moho,
    thickness: gridOf(r.derived.grids, 'crustal-thickness'),
    domains: r.classified.domains,
  };
}

/** The named lines a section reports crossings of. */
export function sectionLines(r: PipelineResult): Record<string, Ring[]> {
  const byKind = (kind: string) => r.boundaries.pieces.filter((p) => p.kind === kind).map((p) => p.coords[0]);
  return {
    'crustal-taper-limit': r.boundaries.support.taper,
    'oceanic-limit': r.boundaries.support.oceanic,
    'oldest-onlapped-crust': byKind('oldest-onlapped-crust'),
    'necking-line': r.boundaries.support.necking,
    'coupling-line': r.boundaries.support.coupling,
  };
}

export function sectionAlong(r: PipelineResult, path: Ring): Section {
  return sampleSection(sectionGrids(r), path, sectionLines(r));
}

/** Proposals for a run; with a sweep's result, ranked by the envelope it crosses (plan.ts). */
export function planFromResult(r: PipelineResult, user: Partial<Record<string, unknown>> = {}, uncertainty?: UncertaintyResult | null): SurveyPlan {
  const params = resolvePlan(user);
  const g = r.geometry;
  const plan = planSurvey(
    {
      crs: g.crs,
      oceanward: r.oceanward,
      extent: extentOf(g),
      cellSize: Math.abs(g.dx),
      taper: r.boundaries.support.taper,
      oceanic: r.boundaries.support.oceanic,
      necking: r.boundaries.support.necking,
      coupling: r.boundaries.support.coupling,
      existing: r.evidence.lines.flatMap((l) => l.coords.map((c) => ({ name: l.name, coords: c }))),
      picks: r.evidence.picks.map((p) => [p.x, p.y] as [number, number]),
      licence: r.evidence.licence,
      envelope: uncertainty ? envelopeOf(uncertainty) : null,
    },
    params,
  );
  const figures = new Map<string, LineFigures>();
  const lines = sectionLines(r);
  const grids = sectionGrids(r);
  for (const l of plan.lines) figures.set(l.id, lineFigures(sampleSection(grids, l.coords, lines), params));
  const programme = programmeFigures(plan.lines.map((l) => l.lengthKm), params);
  return { params, plan, figures, programme };
}
