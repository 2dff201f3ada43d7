import { z } from 'zod';

export const SECTION_PLANES = ['longitudinal', 'transverse', 'plan_view', 'fracture_surface', 'other'] as const;
export type SectionPlane = (typeof SECTION_PLANES)[number];

export const SECTION_PLANE_LABELS: Record<SectionPlane, string> = {
  longitudinal: 'Longitudinal (RD–ND)',
  transverse: 'Transverse (TD–ND)',
  plan_view: 'Plan view (RD–TD)',
  fracture_surface: 'Fracture surface',
  other: 'Other',
};

/** How the specimen was prepared; an etchant brings up the chemical-safety caution in the UI. */
export interface Preparation {
  /** Grinding and polishing steps in order, e.g. "SiC P1200", "3 µm diamond", "OPS 0.04 µm". */
  steps: string[];
  etchant: string;
  etchingTimeS: number | null;
}

export interface Location {
  id: string;
  specimenId: string;
  name: string;
  /** Optional position on the specimen, mm. */
  xMm: number | null;
  yMm: number | null;
  imageCount: number;
}

export interface Specimen {
  id: string;
  projectId: string;
  sampleId: string;
  sampleCode: string;
  code: string;
  /** The process step after which it was cut; null when taken from the initial stack. */
  afterStepId: string | null;
  /** "after step 3: Anneal", for lists. */
  afterStepLabel: string;
  sectionPlane: SectionPlane;
  preparation: Preparation;
  notes: string;
  locations: Location[];
  createdAt: string;
  updatedAt: string;
}

export const ETCHANT_CAUTION =
  'Etchants and electrolytes are hazardous chemicals. Follow the safety data sheet and your lab’s rules: ' +
  'wear the protective equipment it names, work in a fume hood, and never let picric acid dry out.';

const preparation = z.strictObject({
  steps: z.array(z.string().trim().min(1).max(200)).max(30).default([]),
  etchant: z.string().trim().max(200).default(''),
  etchingTimeS: z.number().positive({ error: 'An etching time must be above 0 s.' }).max(86_400).nullable().default(null),
});

export const createSpecimenBody = z.strictObject({
  sampleId: z.uuid({ error: 'Choose a sample.' }),
  code: z.string().trim().regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,39}$/, { error: 'Use 1-40 letters, digits, dots, hyphens or underscores.' }),
  afterStepId: z.uuid().nullable().default(null),
  sectionPlane: z.enum(SECTION_PLANES),
  preparation: preparation.default({ steps: [], etchant: '', etchingTimeS: null }),
  notes: z.string().trim().max(4000).default(''),
});
export type CreateSpecimenBody = z.infer<typeof createSpecimenBody>;

export const updateSpecimenBody = createSpecimenBody.omit({ sampleId: true }).partial();
export type UpdateSpecimenBody = z.infer<typeof updateSpecimenBody>;

export const specimenParams = z.strictObject({
  projectId: z.uuid({ error: 'Not a valid project id.' }),
  specimenId: z.uuid({ error: 'Not a valid specimen id.' }),
});

const position = z.number().min(-10_000).max(10_000).nullable().default(null);
export const locationBody = z.strictObject({
  name: z.string().trim().min(1, { error: 'Enter a name, e.g. "interface 2, centre".' }).max(120),
  xMm: position,
  yMm: position,
});
export type LocationBody = z.infer<typeof locationBody>;

export const locationParams = specimenParams.extend({ locationId: z.uuid({ error: 'Not a valid location id.' }) });
