import { z } from 'zod';

/** One recorded change of an image's pixel size: who, when, old and new value, and how. */
export interface CalibrationChange {
  id: string;
  imageId: string;
  at: string;
  byName: string;
  oldUmPerPx: number | null;
  newUmPerPx: number | null;
  /** 'drawn', 'preset', 'user', 'ome_xml', 'tiff_resolution' or 'none'. */
  source: string;
  /** "drawn by Dr. Maren Tallis on 2026-03-14 along 100 µm over 412 px". */
  note: string;
}

/** A saved instrument set-up whose pixel size is known: applied to many images at once. */
export interface CalibrationPreset {
  id: string;
  projectId: string;
  name: string;
  instrument: string;
  /** Objective or magnification, as the lab writes it: "50x / 0.80", "SEM 2000x". */
  objective: string;
  camera: string;
  umPerPx: number;
  createdAt: string;
}

const point = z.tuple([z.number().finite(), z.number().finite()]);

/** A line drawn along a stage micrometer or burned-in scale bar, with its true length. */
export const drawnCalibrationBody = z.strictObject({
  start: point,
  end: point,
  trueLengthUm: z.number({ error: 'Enter the true length in µm.' }).positive({ error: 'The true length must be above 0 µm.' }).max(1e7),
  /** Sent as true after the person saw the plausibility warning and kept the value. */
  acceptImplausible: z.boolean().default(false),
});
export type DrawnCalibrationBody = z.infer<typeof drawnCalibrationBody>;

export const calibrationPresetBody = z.strictObject({
  name: z.string().trim().min(1, { error: 'Enter a name.' }).max(80),
  instrument: z.string().trim().max(120).default(''),
  objective: z.string().trim().max(80).default(''),
  camera: z.string().trim().max(80).default(''),
  umPerPx: z.number({ error: 'Enter the pixel size in µm per pixel.' }).min(1e-4, { error: 'Below 0.1 nm per pixel.' }).max(1000, { error: 'Above 1 mm per pixel.' }),
});
export type CalibrationPresetBody = z.infer<typeof calibrationPresetBody>;

export const applyPresetBody = z.strictObject({
  imageIds: z.array(z.uuid({ error: 'Not a valid image id.' })).min(1, { error: 'Choose at least one image.' }).max(500),
});
export type ApplyPresetBody = z.infer<typeof applyPresetBody>;
