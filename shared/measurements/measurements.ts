import { z } from 'zod';
import { MARK_KINDS, type CountRules, type MarkKind } from './e112';
import type { PatternSpec } from './patterns';

/**
 * The measurements contract: what a client sends to define a measurement (zod, strict, messages a
 * person can act on) and what the server answers. The server recomputes every number from the
 * definition with the shared E112/E562 code; a client never sends a result.
 */

export const MEASUREMENT_KINDS = ['intercept', 'point_count', 'thickness'] as const;
export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number];

/** Shown with every summary and export (TRADE primer, cautions). */
export const RESEARCH_CAUTION = 'These numbers support research; they do not certify material for structural use.';

/** Bond interfaces are annotations of this class drawn as polylines; they define the layer bands. */
export const BOND_INTERFACE_CLASS = 'Bond interface';

/** How far (image px) a mark may sit from its test line or grid point and still belong to it. */
export const MARK_TOLERANCE_PX = 2;

const finite = z.number({ error: 'Enter a number.' }).finite();
const point = z.tuple([finite, finite], { error: 'A position is [x, y] in image pixels.' });
const lengthUm = (what: string) =>
  z.number({ error: `Enter ${what} in µm.` }).positive({ error: `${what} must be above 0 µm.` }).max(1e6, { error: `${what} is above 1 m; check the unit.` });

/** E112 test patterns (see patterns.ts): sizes in µm on the specimen. */
export const patternSpec = z
  .discriminatedUnion(
    'type',
    [
      z.strictObject({
        type: z.literal('lines'),
        direction: z.enum(['horizontal', 'vertical', 'both', 'angle'], { error: 'Choose horizontal, vertical, both or angle.' }),
        angleDeg: z.number().min(-180).max(180, { error: 'Give the angle in degrees, −180 to 180.' }).optional(),
        spacingUm: lengthUm('The line spacing'),
        count: z.int({ error: 'Give a whole number of lines.' }).min(1, { error: 'Lay at least one line.' }).max(200, { error: 'Use at most 200 lines.' }),
        marginUm: z.number().min(0, { error: 'A margin cannot be negative.' }).max(1e6).optional(),
      }),
      z.strictObject({ type: z.literal('circle'), diameterUm: lengthUm('The diameter'), centre: point.optional() }),
      z.strictObject({ type: z.literal('three_circles'), largestDiameterUm: lengthUm('The largest diameter'), centre: point.optional() }),
    ],
    { error: 'Choose a pattern: lines, circle or three_circles.' },
  )
  .refine((p) => p.type !== 'lines' || p.angleDeg === undefined || p.direction === 'angle', { error: 'An angle applies only to direction "angle".', path: ['angleDeg'] }) satisfies z.ZodType<PatternSpec>;

/** Where a measurement applies: the whole image, inside an outline annotation, or a layer band (optionally near its interfaces). */
export const whereSpec = z.discriminatedUnion(
  'type',
  [
    z.strictObject({ type: z.literal('image') }),
    z.strictObject({ type: z.literal('region'), annotationId: z.uuid({ error: 'Choose an outline annotation on this image.' }) }),
    z.strictObject({
      type: z.literal('band'),
      band: z.int({ error: 'Bands are numbered 1, 2, 3… from the top (or left) edge.' }).min(1, { error: 'Bands are numbered from 1.' }),
      /** Only the part of the band this far from the nearest bond interface, e.g. 0-20 µm. */
      distanceUm: z
        .strictObject({ min: z.number().min(0, { error: 'A distance cannot be negative.' }), max: lengthUm('The largest distance') })
        .refine((d) => d.min < d.max, { error: 'The sub-band must end farther from the interface than it starts.', path: ['max'] })
        .optional(),
    }),
  ],
  { error: 'Choose where to measure: image, region or band.' },
);
export type WhereSpec = z.infer<typeof whereSpec>;

export const placementSpec = z.strictObject({
  /** The whole pattern (or grid) moved by this many image pixels from its centred position. */
  offsetPx: point.default([0, 0]),
});

export const MARK_STATUSES = ['confirmed', 'suggested'] as const;

/** A boundary hit on a test line; only confirmed marks count. */
export const interceptMark = z.strictObject({
  x: finite,
  y: finite,
  /** Index of the test line in the laid pattern (the answer's `testLines[].line`). */
  line: z.int({ error: 'Name the test line by its number.' }).min(0),
  kind: z.enum(MARK_KINDS, { error: 'A mark is a crossing, tangent, triple_point or line_end.' }),
  status: z.enum(MARK_STATUSES).default('confirmed'),
}) satisfies z.ZodType<{ kind: MarkKind }, unknown>;
export type InterceptMark = z.infer<typeof interceptMark>;

export const countRules = z.strictObject({
  count: z.enum(['intersections', 'intercepts'], { error: 'Count intersections (P) or intercepts (N).' }),
  triplePoint: z.number().min(0).max(3, { error: 'A triple point counts between 0 and 3.' }),
}) satisfies z.ZodType<CountRules>;

const note = z.string().trim().max(2000, { error: 'Use at most 2000 characters.' }).default('');

/** Sub-band edges: at least two, rising, from 0 µm (or more) outwards. */
export const distanceBins = z
  .array(z.number({ error: 'Enter each edge in µm.' }).finite().min(0, { error: 'A distance from the interface cannot be negative.' }).max(1e6, { error: 'An edge is above 1 m; check the unit.' }), {
    error: 'Give the sub-band edges as a list of distances in µm.',
  })
  .min(2, { error: 'Give at least two edges (e.g. 0 and 20 µm) for one sub-band.' })
  .max(21, { error: 'Use at most 20 sub-bands.' })
  .refine((edges) => edges.every((e, i) => i === 0 || e > edges[i - 1]!), { error: 'Each edge must lie farther from the interface than the one before (e.g. 0, 20, 40 µm).' });

export const interceptBody = z
  .strictObject({
    kind: z.literal('intercept'),
    pattern: patternSpec,
    placement: placementSpec.default({ offsetPx: [0, 0] }),
    where: whereSpec.default({ type: 'image' }),
    marks: z.array(interceptMark).max(20_000, { error: 'Use at most 20 000 marks.' }).default([]),
    /** Defaults: E112 lines count P with triple points 1½; circles count P with triple points 2 (see e112.ts). */
    rules: countRules.optional(),
    /** Annealing twin boundaries are not grain boundaries for E112; say whether they were skipped. */
    twinsExcluded: z.boolean().default(true),
    /**
     * Two-phase structures: the phase whose intercepts were counted and its volume fraction, typed in or
     * taken from a saved point count (E562) of the same place on the same image (the server then fills it in).
     */
    phase: z
      .strictObject({
        name: z.string().trim().min(1, { error: 'Name the phase.' }).max(60),
        volumeFraction: z.number().gt(0, { error: 'A volume fraction lies above 0.' }).lte(1, { error: 'A volume fraction is at most 1.' }).optional(),
        pointCountId: z.uuid({ error: 'Choose a saved point count on this image.' }).optional(),
      })
      .refine((p) => p.volumeFraction !== undefined || p.pointCountId !== undefined, {
        error: 'Give the volume fraction of the phase, or choose a saved point count that measured it.',
        path: ['volumeFraction'],
      })
      .nullable()
      .default(null),
    /**
     * Sub-bands by distance from the nearest bond interface: bin edges in µm, e.g. [0, 20, 40, 60] for
     * 0–20, 20–40 and 40–60 µm. The field is counted as a whole and, besides, per sub-band.
     */
    distanceBinsUm: distanceBins.nullable().default(null),
    note,
  })
  .refine((b) => b.phase === null || b.rules === undefined || b.rules.count === 'intercepts', {
    error: 'A two-phase measurement counts intercepts (N) of its phase: set rules.count to "intercepts".',
    path: ['rules', 'count'],
  });

/** A grid point inside the feature counts 1, on its boundary ½ (E562). */
export const pointMark = z.strictObject({
  x: finite,
  y: finite,
  hit: z.enum(['inside', 'boundary'], { error: 'A hit is inside the feature or on its boundary.' }),
  status: z.enum(MARK_STATUSES).default('confirmed'),
});
export type PointMark = z.infer<typeof pointMark>;

export const pointCountBody = z.strictObject({
  kind: z.literal('point_count'),
  /** A square grid, centred on the image like the line patterns. */
  grid: z.strictObject({ spacingUm: lengthUm('The grid spacing') }),
  placement: placementSpec.default({ offsetPx: [0, 0] }),
  where: whereSpec.default({ type: 'image' }),
  /** What is counted, e.g. "oxide" or "martensite". */
  phaseName: z.string().trim().min(1, { error: 'Name what is counted (e.g. oxide).' }).max(60),
  marks: z.array(pointMark).max(10_000, { error: 'Use at most 10 000 marks.' }).default([]),
  note,
});

export const thicknessBody = z.strictObject({
  kind: z.literal('thickness'),
  /** A band between two bond interfaces. */
  where: z.strictObject({ type: z.literal('band', { error: 'Thickness is measured across a band between two bond interfaces.' }), band: z.int().min(1, { error: 'Bands are numbered from 1.' }) }),
  /** Distance between thickness samples along the upper (left) interface. */
  spacingUm: lengthUm('The sample spacing'),
  note,
});

/** POST /images/:imageId/measurements. */
export const measurementBody = z.discriminatedUnion('kind', [interceptBody, pointCountBody, thicknessBody], {
  error: 'Choose a kind: intercept, point_count or thickness.',
});
export type MeasurementBody = z.infer<typeof measurementBody>;
export type InterceptBody = z.infer<typeof interceptBody>;
export type PointCountBody = z.infer<typeof pointCountBody>;
export type ThicknessBody = z.infer<typeof thicknessBody>;

const version = z.int({ error: 'Send the version you loaded.' }).min(1, { error: 'Send the version you loaded.' });

/** PATCH: any definition fields of the measurement's kind, with the version you loaded; the kind never changes. */
export const updateMeasurementBody = z
  .strictObject({
    version,
    // Checked again as a whole once merged into the stored definition (so they read loosely here).
    pattern: patternSpec.optional(),
    placement: placementSpec.optional(),
    where: z.unknown().optional(),
    marks: z.array(z.unknown()).optional(),
    rules: countRules.optional(),
    twinsExcluded: z.boolean().optional(),
    phase: z.unknown().optional(),
    distanceBinsUm: z.unknown().optional(),
    grid: z.unknown().optional(),
    phaseName: z.string().optional(),
    spacingUm: z.number().optional(),
    note: z.string().optional(),
  })
  .refine((b) => Object.keys(b).length > 1, { error: 'Send at least one field to change besides the version.' });
export type UpdateMeasurementBody = z.infer<typeof updateMeasurementBody>;

export const recomputeBody = z.strictObject({ version });

export const CROSSING_DETECTORS = ['valleys', 'steps'] as const;

/** POST /images/:imageId/measurements/suggest: nothing is saved. */
export const suggestBody = z.strictObject({
  pattern: patternSpec,
  placement: placementSpec.default({ offsetPx: [0, 0] }),
  where: whereSpec.default({ type: 'image' }),
  /** Default by modality: light optical → valleys (dark boundaries); EBSD maps and BSE → steps. */
  detector: z.enum(CROSSING_DETECTORS, { error: 'Choose valleys (dark etched boundaries) or steps (grains of flat colour).' }).optional(),
});
export type SuggestBody = z.infer<typeof suggestBody>;

const uuid = (what: string) => z.uuid({ error: `Not a valid ${what} id.` });
export const imageMeasurementsParams = z.strictObject({ projectId: uuid('project'), imageId: uuid('image') });
export const measurementParams = imageMeasurementsParams.extend({ measurementId: uuid('measurement') });
export const specimenMeasurementsParams = z.strictObject({ projectId: uuid('project'), specimenId: uuid('specimen') });
export const deleteMeasurementQuery = z.strictObject({ version: z.coerce.number().int().min(1, { error: 'Send the version you loaded.' }) });

