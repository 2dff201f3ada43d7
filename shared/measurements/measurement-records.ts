import type { CountRules } from './e112';
import type { CrossingDetector } from './crossings';
import type { InterceptMark, MeasurementBody, MeasurementKind } from './measurements';

/** What the measurements API answers (the requests are in measurements.ts). */


/** A test line as counted: the parts of one laid line that lie in the image and the chosen region or band, in image px. */
export interface TestPath {
  line: number;
  family: 'horizontal' | 'vertical' | 'angle' | 'circle';
  /** Connected pieces (polylines); empty when the line misses the region. */
  pieces: [number, number][][];
  lengthPx: number;
}

/** 'along' and 'across' the bond interfaces (or image x when none are drawn); 'all' for circles and pooled directions. */
export type Direction = 'along' | 'across' | 'oblique' | 'all';

export interface InterceptFigures {
  lineLengthUm: number;
  /** P or N: summed values of the confirmed marks. */
  count: number;
  /** P_L or N_L, mm⁻¹; null until something is counted. */
  perMm: number | null;
  /** l̄ in µm (of the phase, for two-phase measurements). */
  meanInterceptUm: number | null;
  /** ASTM E112 grain size number from l̄. */
  g: number | null;
  /** ISO 643 index for the same count. */
  gIso: number | null;
}

export interface InterceptResult extends InterceptFigures {
  kind: 'intercept';
  countSymbol: 'P' | 'N';
  rules: CountRules;
  direction: Direction;
  /** For direction "both": along vs across and the anisotropy index l̄∥ / l̄⊥. */
  byDirection: { along: InterceptFigures; across: InterceptFigures; anisotropyIndex: number | null } | null;
  twinsExcluded: boolean;
  /** Two-phase: the phase, its V_V, and the saved point count V_V came from (null when typed in). */
  phase: { name: string; volumeFraction: number; pointCount: PointCountSource | null } | null;
  /** Per sub-band by distance from the nearest bond interface (all directions pooled); null without sub-bands. */
  bins: DistanceBin[] | null;
  confirmedMarks: number;
  /** Suggested marks are shown, never counted. */
  suggestedMarks: number;
  /** Confirmed marks that no longer lie on the counted lines (after a recompute) and were left out. */
  marksLeftOut: number;
  /** Sentences that belong beside the number: method, rules, exclusions. */
  statements: string[];
}

/** One sub-band of a field: the counted line and marks lying minUm–maxUm from the nearest bond interface. */
export interface DistanceBin extends InterceptFigures {
  minUm: number;
  maxUm: number;
  /** Confirmed marks in this sub-band. */
  marks: number;
}

/** The saved point count a two-phase result took its volume fraction from, as it was when used. */
export interface PointCountSource {
  id: string;
  version: number;
  phaseName: string;
  whereLabel: string;
  pointFraction: number;
}

export interface PointCountResult {
  kind: 'point_count';
  phaseName: string;
  /** P_T: grid points inside the region or band. */
  gridPoints: number;
  inside: number;
  onBoundary: number;
  /** P_p = (inside + ½·boundary) / P_T (E562). */
  pointFraction: number;
  confirmedMarks: number;
  suggestedMarks: number;
  marksLeftOut: number;
  statements: string[];
}

export interface ThicknessResult {
  kind: 'thickness';
  band: number;
  spacingUm: number;
  meanUm: number;
  sUm: number;
  minUm: number;
  maxUm: number;
  /** Local thickness at each sample along the upper (left) interface, for a small plot. */
  samplesUm: number[];
  statements: string[];
}

export type MeasurementResult = InterceptResult | PointCountResult | ThicknessResult;

export interface Measurement {
  id: string;
  projectId: string;
  imageId: string;
  specimenId: string;
  kind: MeasurementKind;
  /** The definition as stored, defaults filled in. */
  definition: MeasurementBody;
  /** "whole image", "band 2, 0–20 µm from the nearest bond interface", "region “Zone A”". */
  whereLabel: string;
  /** Test lines as counted (intercepts), image px. */
  testLines: TestPath[];
  /** Grid points counted (point counts), image px. */
  gridPoints: [number, number][];
  /** Snapshot of the pixel size the result was computed with. */
  pixelSize: { umPerPx: number; source: string };
  result: MeasurementResult;
  /**
   * Set when what the result was computed from changed afterwards: the image's pixel size, the bond
   * interfaces or region outline it used (redrawn, deleted, added), or the point count it took V_V from.
   */
  stale: StaleNote | null;
  authorId: string;
  authorName: string;
  createdAt: string;
  updatedAt: string;
  computedAt: string;
  version: number;
}

export interface StaleNote {
  measuredUmPerPx: number;
  imageUmPerPx: number | null;
  /** One sentence per change besides the pixel size ("The bond interface “top” was redrawn."). */
  changes: string[];
  /** All of it, with what to do. */
  message: string;
}

/** A result that was replaced (edit, recompute) or removed; the history is only ever appended to. */
export interface MeasurementHistoryEntry {
  version: number;
  reason: 'edited' | 'recomputed' | 'deleted';
  umPerPx: number;
  pixelSizeSource: string;
  result: MeasurementResult;
  replacedAt: string;
  replacedByName: string;
}

export interface MeasurementDetail extends Measurement {
  history: MeasurementHistoryEntry[];
}

export interface SuggestedCrossings {
  detector: CrossingDetector;
  marks: InterceptMark[];
  perLine: { line: number; count: number; samples: number }[];
  testLines: TestPath[];
  /** Time to read the pixels and run the detector, ms. */
  ms: number;
}

/** Mean, spread and 95 % confidence of one quantity across fields (Student t, n − 1; see statistics.ts). */
export interface AcrossFields {
  n: number;
  mean: number;
  /** null for a single field. */
  s: number | null;
  ci95: number | null;
  relativeAccuracyPct: number | null;
  /** %RA above 10 % (or a single field): more fields are needed. */
  relativeAccuracyWarning: boolean;
}

interface SummaryGroup {
  /** "whole image", "band 2", "band 2, 0–20 µm from the nearest bond interface", "outlined regions". */
  where: string;
  /** Fields measured on a pixel size or shapes that have changed since (recompute them). */
  staleFields: number;
  /** Fields left out because nothing was counted on them yet. */
  emptyFields: number;
  warnings: string[];
}

export interface InterceptSummary extends SummaryGroup {
  direction: Direction;
  /** The layer band of the group, if it is one (or a sub-band of one). */
  band: number | null;
  /** Set for a sub-band by distance from the nearest bond interface. */
  distanceUm: { min: number; max: number } | null;
  phase: string | null;
  /** l̄ per field, µm. */
  meanIntercept: AcrossFields;
  /** G from the mean l̄ (never a mean of G values). */
  g: number;
  gIso: number;
  totalCount: number;
  totalLineLengthUm: number;
  countSymbols: ('P' | 'N')[];
  /** l̄ along / l̄ across for the same band, on the 'along' row; null elsewhere. */
  anisotropyIndex: number | null;
}

export interface PointCountSummary extends SummaryGroup {
  phaseName: string;
  pointFraction: AcrossFields;
  totalGridPoints: number;
}

export interface ThicknessSummary extends SummaryGroup {
  /** Per-field mean thickness, µm. */
  thickness: AcrossFields;
}

export interface SpecimenMeasurementSummary {
  specimenId: string;
  specimenCode: string;
  intercepts: InterceptSummary[];
  pointCounts: PointCountSummary[];
  thickness: ThicknessSummary[];
  caution: string;
}
