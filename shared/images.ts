import { z } from 'zod';
import { ELEMENT_SYMBOLS } from './archive/elements';
import { pagingQuery } from './paging';
import type { PixelSizeSource } from './pixel-size';

export { MODALITIES, MODALITY_LABELS, type Modality } from './modalities';
import { MODALITIES, type Modality } from './modalities';

export const PROCESSING_STATES = ['queued', 'processing', 'ready', 'failed'] as const;
export type ProcessingState = (typeof PROCESSING_STATES)[number];

/** Formats accepted for upload, identified by content. */
export const IMAGE_FORMATS = ['tiff', 'png', 'jpeg', 'webp'] as const;
export type ImageFormat = (typeof IMAGE_FORMATS)[number];

export interface PixelSizeInfo {
  /** µm per pixel along x and y; null when uncalibrated. */
  xUm: number | null;
  yUm: number | null;
  source: PixelSizeSource;
  /** True once a person confirmed or typed the value. */
  confirmed: boolean;
  /** One sentence on where the value came from (or why there is none). */
  note: string;
}

export interface ProcessingInfo {
  state: ProcessingState;
  /** 0-100 while processing; 100 when ready. */
  progress: number;
  /** Why the last attempt failed; null otherwise. */
  failureReason: string | null;
  attempts: number;
}

/** A row of the image search. */
export interface ImageSummary {
  id: string;
  projectId: string;
  originalName: string;
  modality: Modality;
  /** Element symbol of an EDS map; null otherwise. */
  element: string | null;
  specimenId: string;
  specimenCode: string;
  sampleId: string;
  sampleCode: string;
  locationId: string | null;
  locationName: string | null;
  magnification: number | null;
  pixelSize: PixelSizeInfo;
  width: number;
  height: number;
  bitDepth: number;
  channels: number;
  format: ImageFormat;
  tags: string[];
  acquiredAt: string | null;
  uploadedAt: string;
  uploaderId: string;
  uploaderName: string;
  processing: ProcessingInfo;
}

/** The image page: the summary plus instrument settings, notes and the stored file. */
export interface ImageRecord extends ImageSummary {
  instrument: string;
  acceleratingVoltageKv: number | null;
  workingDistanceMm: number | null;
  detector: string;
  notes: string;
  sha256: string;
  byteSize: number;
  /** Pages in the file; only the first is shown. */
  pageCount: number;
  /** The Deep Zoom tile set once ready. */
  pyramid: { levels: number; tileSize: number; format: 'jpeg' } | null;
  updatedAt: string;
}

/** Answer of an upload: the new record and anything the uploader should know (e.g. pages left out). */
export interface UploadResult {
  image: ImageRecord;
  notices: string[];
}

// Multipart fields arrive as strings: an empty field means "not given".
const blankToUndefined = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const optionalNumber = (max: number, what: string) =>
  z.preprocess(blankToUndefined, z.coerce.number({ error: `Enter ${what} as a number.` }).positive({ error: `${what} must be above 0.` }).max(max).optional());
const text = (max: number) => z.string().trim().max(max, { error: `Use at most ${max} characters.` });
const tag = z
  .string()
  .trim()
  .min(1)
  .max(40, { error: 'A tag has at most 40 characters.' })
  .regex(/^[^,\u0000-\u001f]+$/, { error: 'A tag cannot contain commas or control characters.' });
/** Tags as a list, or (from a form) one comma-separated string. */
const tags = z.preprocess(
  (v) => (typeof v === 'string' ? v.split(',').map((t) => t.trim()).filter(Boolean) : v),
  z.array(tag).max(30, { error: 'Use at most 30 tags.' }).transform((list) => [...new Set(list)]),
);
const element = z.enum(ELEMENT_SYMBOLS, { error: 'Use an element symbol such as Fe, Cr or Ni.' });
const acquiredAt = z.preprocess(
  blankToUndefined,
  z.union([z.iso.datetime({ offset: true }), z.iso.date()], { error: 'Use an ISO date (2025-03-14) or date-time.' }).optional(),
);

const elementRule = <T extends { modality?: Modality; element?: string | null }>(v: T, ctx: z.RefinementCtx) => {
  if (v.modality === 'eds_element' && !v.element) ctx.addIssue({ code: 'custom', path: ['element'], message: 'An EDS element map needs its element.' });
  if (v.modality && v.modality !== 'eds_element' && v.element) ctx.addIssue({ code: 'custom', path: ['element'], message: 'Only EDS element maps carry an element.' });
};

/** Multipart fields sent with each uploaded file (the batch's values merged with the file's own). */
export const uploadFields = z
  .strictObject({
    specimenId: z.uuid({ error: 'Choose a specimen.' }),
    locationId: z.preprocess(blankToUndefined, z.uuid({ error: 'Not a valid location id.' }).optional()),
    modality: z.enum(MODALITIES, { error: 'Choose how the image was made.' }),
    element: z.preprocess(blankToUndefined, element.optional()),
    instrument: text(120).default(''),
    magnification: optionalNumber(10_000_000, 'the magnification'),
    acceleratingVoltageKv: optionalNumber(1000, 'the accelerating voltage (kV)'),
    workingDistanceMm: optionalNumber(1000, 'the working distance (mm)'),
    detector: text(120).default(''),
    acquiredAt,
    pixelSizeUm: optionalNumber(1_000_000, 'the pixel size (µm/px)'),
    tags: tags.default([]),
    notes: text(4000).default(''),
  })
  .superRefine(elementRule);
export type UploadFields = z.infer<typeof uploadFields>;

/** Changes to an image's description; the file itself never changes. */
export const updateImageBody = z
  .strictObject({
    specimenId: z.uuid({ error: 'Choose a specimen.' }),
    locationId: z.uuid({ error: 'Not a valid location id.' }).nullable(),
    modality: z.enum(MODALITIES, { error: 'Choose how the image was made.' }),
    element: element.nullable(),
    instrument: text(120),
    magnification: z.number().positive().max(10_000_000).nullable(),
    acceleratingVoltageKv: z.number().positive().max(1000).nullable(),
    workingDistanceMm: z.number().positive().max(1000).nullable(),
    detector: text(120),
    acquiredAt: z.union([z.iso.datetime({ offset: true }), z.iso.date()], { error: 'Use an ISO date or date-time.' }).nullable(),
    tags,
    notes: text(4000),
    /** A calibrated value typed by a person: becomes the pixel size, source `user`. */
    pixelSizeUm: z.number().positive({ error: 'A pixel size must be above 0 µm.' }).max(1_000_000),
    /** Only with pixelSizeUm, for non-square pixels. */
    pixelSizeYUm: z.number().positive().max(1_000_000),
    /** Confirms the pixel size read from the file as it is. */
    confirmPixelSize: z.literal(true),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'Send at least one field to change.' })
  .refine((v) => v.pixelSizeYUm === undefined || v.pixelSizeUm !== undefined, { error: 'Send pixelSizeUm with pixelSizeYUm.', path: ['pixelSizeYUm'] })
  .refine((v) => !(v.confirmPixelSize && v.pixelSizeUm !== undefined), { error: 'Either confirm the pixel size or enter one, not both.', path: ['confirmPixelSize'] });
export type UpdateImageBody = z.infer<typeof updateImageBody>;

export const IMAGE_SORT_FIELDS = ['uploadedAt', 'acquiredAt', 'originalName', 'magnification', 'pixelSizeUm', 'specimen'] as const;
export type ImageSortField = (typeof IMAGE_SORT_FIELDS)[number];

const list = <T extends z.ZodType>(item: T) =>
  z.preprocess((v) => (v === undefined ? undefined : (Array.isArray(v) ? v : [v]).flatMap((s) => String(s).split(',')).map((s) => s.trim()).filter(Boolean)), z.array(item).max(50).optional());
const uuid = (what: string) => z.uuid({ error: `Not a valid ${what} id.` }).optional();
const range = (what: string) => z.coerce.number({ error: `Enter ${what} as a number.` }).nonnegative().optional();
const day = z.iso.date({ error: 'Use an ISO date, e.g. 2025-03-14.' }).optional();

/** Image search over a whole project: every filter optional, combined with AND; paging as elsewhere. */
export const searchImagesQuery = z
  .strictObject({
    ...pagingQuery,
    dir: z.enum(['asc', 'desc']).default('desc'),
    sort: z.enum(IMAGE_SORT_FIELDS).default('uploadedAt'),
    sampleId: uuid('sample'),
    materialId: uuid('material'),
    /** The process step after which the specimen was cut. */
    stepId: uuid('process step'),
    specimenId: uuid('specimen'),
    locationId: uuid('location'),
    modality: list(z.enum(MODALITIES, { error: 'Unknown modality.' })),
    magnificationMin: range('the lowest magnification'),
    magnificationMax: range('the highest magnification'),
    pixelSizeMinUm: range('the smallest pixel size (µm)'),
    pixelSizeMaxUm: range('the largest pixel size (µm)'),
    /** Images carrying every one of these tags. */
    tags: list(tag),
    /** Acquisition date range, inclusive. */
    acquiredFrom: day,
    acquiredTo: day,
    uploaderId: uuid('uploader'),
    state: list(z.enum(PROCESSING_STATES, { error: 'Unknown processing state.' })),
    /** Words in the notes or the file name, without regard to case. */
    q: z.string().trim().max(200).default(''),
  })
  .refine((v) => v.magnificationMin === undefined || v.magnificationMax === undefined || v.magnificationMin <= v.magnificationMax, {
    error: 'The lowest magnification is above the highest.',
    path: ['magnificationMin'],
  })
  .refine((v) => v.pixelSizeMinUm === undefined || v.pixelSizeMaxUm === undefined || v.pixelSizeMinUm <= v.pixelSizeMaxUm, {
    error: 'The smallest pixel size is above the largest.',
    path: ['pixelSizeMinUm'],
  })
  .refine((v) => !v.acquiredFrom || !v.acquiredTo || v.acquiredFrom <= v.acquiredTo, { error: 'The date range ends before it starts.', path: ['acquiredFrom'] });
export type SearchImagesQuery = z.infer<typeof searchImagesQuery>;

export const imageParams = z.strictObject({
  projectId: z.uuid({ error: 'Not a valid project id.' }),
  imageId: z.uuid({ error: 'Not a valid image id.' }),
});

/** A Deep Zoom tile: `/tiles/{level}/{col}_{row}.jpg`. Nothing else under tiles/ can be named. */
export const tileParams = imageParams.extend({
  level: z.coerce.number().int().min(0).max(40),
  tile: z.string().regex(/^\d{1,6}_\d{1,6}\.jpg$/, { error: 'A tile is named {column}_{row}.jpg.' }),
});

/** IIIF Image API request parts; what they may ask for is checked against the tile set. */
export const iiifParams = imageParams.extend({
  region: z.string().max(80),
  size: z.string().max(40),
  rotation: z.string().max(10),
  quality: z.string().max(20),
});
