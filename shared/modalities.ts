/** How an image was made, without zod (the viewer imports the labels; images.ts re-exports them with the schemas). */

/** Our own wording; the groups follow the instruments a metallography lab has. */
export const MODALITIES = [
  'lom_bright_field',
  'lom_dark_field',
  'lom_polarised',
  'lom_dic',
  'sem_secondary',
  'sem_backscattered',
  'ebsd_orientation',
  'ebsd_phase',
  'ebsd_band_contrast',
  'ebsd_other',
  'eds_element',
  'fracture_surface',
  'other',
] as const;
export type Modality = (typeof MODALITIES)[number];

export const MODALITY_LABELS: Record<Modality, string> = {
  lom_bright_field: 'Light optical, bright field',
  lom_dark_field: 'Light optical, dark field',
  lom_polarised: 'Light optical, polarised light',
  lom_dic: 'Light optical, differential interference contrast',
  sem_secondary: 'SEM, secondary electrons',
  sem_backscattered: 'SEM, backscattered electrons',
  ebsd_orientation: 'EBSD map, orientation colours',
  ebsd_phase: 'EBSD map, phases',
  ebsd_band_contrast: 'EBSD map, band contrast',
  ebsd_other: 'EBSD map, other',
  eds_element: 'EDS element map',
  fracture_surface: 'Fracture surface',
  other: 'Other',
};
