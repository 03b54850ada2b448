/**
 * Survey-planning parameters, with units, defaults and where each default comes from. A planning aid:
 * marine surveys need permits, environmental mitigation and qualified operators.
 */

export interface PlanParams {
  spacingKm: number;
  overhangLandwardKm: number;
  overhangOceanwardKm: number;
  smoothingKm: number;
  turnAngleDeg: number;
  existingToleranceKm: number;
  existingToleranceDeg: number;
  clipToLicence: boolean;
  vWater: number;
  vSediment0: number;
  sedimentGradient: number;
  vCrust: number;
  recordMarginS: number;
  vesselSpeedKn: number;
  lineChangeH: number;
  runInOutKm: number;
  downtimeFraction: number;
  costPerKm: number | null;
}

export const DEFAULT_PLAN: Readonly<PlanParams> = {
  spacingKm: 20,
  overhangLandwardKm: 20,
  overhangOceanwardKm: 20,
  smoothingKm: 50,
  turnAngleDeg: 20,
  existingToleranceKm: 2,
  existingToleranceDeg: 10,
  clipToLicence: false,
  vWater: 1500,
  vSediment0: 1800,
  sedimentGradient: 0.5,
  vCrust: 6200,
  recordMarginS: 2,
  vesselSpeedKn: 4.5,
  lineChangeH: 2,
  runInOutKm: 3,
  downtimeFraction: 0.25,
  costPerKm: null,
};

export interface PlanSpec {
  readonly key: keyof PlanParams;
  readonly label: string;
  readonly unit: string;
  readonly doc: string;
  readonly source: string;
  readonly min?: number;
  readonly max?: number;
  readonly nullable?: boolean;
  readonly boolean?: boolean;
}

export const PLAN_SPECS: readonly PlanSpec[] = [
  { key: 'spacingKm', label: 'Dip-line spacing', unit: 'km', min: 1, max: 500, doc: 'Distance between parallel proposed dip lines.', source: 'user choice' },
  { key: 'overhangLandwardKm', label: 'Landward overhang', unit: 'km', min: 0, max: 500, doc: 'How far each dip line runs beyond the crustal taper limit into continental crust.', source: 'user choice' },
  { key: 'overhangOceanwardKm', label: 'Oceanward overhang', unit: 'km', min: 0, max: 500, doc: 'How far each dip line runs beyond the landward limit of oceanic crust.', source: 'user choice' },
  { key: 'smoothingKm', label: 'Midline smoothing length', unit: 'km', min: 0, max: 1000, doc: 'Moving-average length for the zone midline before its strike is measured.', source: 'issue default (50 km)' },
  { key: 'turnAngleDeg', label: 'Strike turn for a new segment', unit: '°', min: 1, max: 90, doc: 'A new family of dip lines starts where the smoothed midline turns by more than this.', source: 'a choice' },
  { key: 'existingToleranceKm', label: 'Existing-line distance tolerance', unit: 'km', min: 0, max: 50, doc: 'Proposals running within this distance of an existing line…', source: 'issue default (2 km)' },
  { key: 'existingToleranceDeg', label: 'Existing-line angle tolerance', unit: '°', min: 0, max: 90, doc: '…and within this angle of it are dropped.', source: 'issue default (10°)' },
  { key: 'clipToLicence', label: 'Clip to the licence', unit: '', boolean: true, doc: 'Cut proposals at the licence boundary (otherwise they may extend beyond it).', source: 'user choice' },
  { key: 'vWater', label: 'Water velocity', unit: 'm/s', min: 1400, max: 1600, doc: 'Interval velocity of sea water.', source: 'common practice (1480–1540 m/s)' },
  { key: 'vSediment0', label: 'Sediment velocity at the seabed', unit: 'm/s', min: 1400, max: 4000, doc: 'v(z) = v0 + k·z below the seabed.', source: 'common practice (1600–2000 m/s), from memory' },
  { key: 'sedimentGradient', label: 'Sediment velocity gradient k', unit: '1/s', min: 0, max: 3, doc: 'Increase of sediment velocity with depth below the seabed.', source: 'common practice (0.3–0.8 s⁻¹), from memory' },
  { key: 'vCrust', label: 'Crust velocity', unit: 'm/s', min: 3000, max: 8000, doc: 'Mean interval velocity of the crust (continental or oceanic).', source: 'from memory: 6–6.5 km/s typical crystalline crust' },
  { key: 'recordMarginS', label: 'Record-length margin', unit: 's', min: 0, max: 10, doc: 'Added to the largest two-way time to the Moho along a line.', source: 'issue default (2 s)' },
  { key: 'vesselSpeedKn', label: 'Vessel speed on line', unit: 'kn', min: 1, max: 15, doc: 'Acquisition speed.', source: 'common practice for 2D (4.5–5 kn)' },
  { key: 'lineChangeH', label: 'Line change time', unit: 'h', min: 0, max: 48, doc: 'Turn and transit between lines.', source: 'user input' },
  { key: 'runInOutKm', label: 'Run-in and run-out per line', unit: 'km', min: 0, max: 50, doc: 'Extra sailed distance per line (both ends together).', source: 'user input' },
  { key: 'downtimeFraction', label: 'Weather and downtime', unit: 'fraction', min: 0, max: 5, doc: 'Added fraction of the productive time (0.25 = +25 %).', source: 'user input' },
  { key: 'costPerKm', label: 'Cost per line-km', unit: 'currency/km', min: 0, max: 1e9, nullable: true, doc: 'Optional; no default. Gives a programme cost when set.', source: 'user input (no default)' },
];

export function resolvePlan(user: Partial<Record<string, unknown>> = {}): PlanParams {
  const p: Record<string, unknown> = { ...DEFAULT_PLAN };
  const known = new Map(PLAN_SPECS.map((s) => [s.key as string, s]));
  for (const [k, v] of Object.entries(user)) {
    const spec = known.get(k);
    if (!spec) continue; // pipeline parameters share the params file; they are checked there
    if (spec.boolean) {
      p[k] = v === true || v === 'true' || v === 1;
      continue;
    }
    if (v === null || v === undefined || v === '') {
      if (!spec.nullable) throw new Error(`plan parameter ${k} needs a value`);
      p[k] = null;
      continue;
    }
    const n = typeof v === 'number' ? v : NaN;
    if (!Number.isFinite(n) || (spec.min !== undefined && n < spec.min) || (spec.max !== undefined && n > spec.max)) {
      throw new Error(`plan parameter ${k} = ${JSON.stringify(v)} must be a number in ${spec.min}…${spec.max} ${spec.unit}`);
    }
    p[k] = n;
  }
  return p as unknown as PlanParams;
}
