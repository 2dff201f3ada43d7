import type { EntityManager } from 'typeorm';
import type { ProcessStepInput } from '../../shared/archive/process-route';
import { Material } from '../archive/material.entity';
import { RouteStep } from '../archive/route-step.entity';
import { SampleLayer } from '../archive/sample-layer.entity';
import { Sample } from '../archive/sample.entity';
import { SpecimenLocation } from '../archive/specimen-location.entity';
import { Specimen } from '../archive/specimen.entity';

// Invented alloys and a roll-bonding campaign of the demo lab; compositions are plausible, not real products.
const MATERIALS = [
  { designation: 'KV-T22', materialClass: 'austenitic, twinning', composition: { wtPct: { Mn: 22.1, C: 0.61, Al: 0.3, Si: 0.2 }, balance: 'Fe' }, notes: 'Hot-rolled plate, 3 mm, solution annealed.' },
  { designation: 'KV-M9', materialClass: 'austenitic, transforming', composition: { wtPct: { Cr: 16.8, Ni: 6.9, Mn: 1.1, Si: 0.5, C: 0.08 }, balance: 'Fe' }, notes: 'Cold-rolled strip, 1.5 mm.' },
];

const ROUTE: ProcessStepInput[] = [
  { type: 'surface_preparation', date: '2026-02-03', params: { details: 'Degreased in acetone, wire-brushed, 0.3 mm stainless brush' } },
  { type: 'roll_bonding', date: '2026-02-03', params: { reductionPct: 50 }, notes: 'Pass 1, 400 °C preheat 10 min' },
  { type: 'anneal', date: '2026-02-04', params: { temperatureC: 800, timeMin: 30, atmosphere: 'argon' } },
  { type: 'cut_and_stack', date: '2026-02-10', params: { pieces: 2 } },
  { type: 'roll_bonding', date: '2026-02-10', params: { reductionPct: 50 }, notes: 'Pass 2' },
  { type: 'anneal', date: '2026-02-11', params: { temperatureC: 800, timeMin: 30, atmosphere: 'argon' } },
  { type: 'cut_and_stack', date: '2026-02-17', params: { pieces: 2 } },
  { type: 'roll_bonding', date: '2026-02-17', params: { reductionPct: 50 }, notes: 'Pass 3' },
  { type: 'tensile_test', date: '2026-03-02', params: { details: 'Sub-size flat specimens along RD, 10⁻³ s⁻¹' } },
];

/** Materials, one three-pass laminate with its route, and specimens with locations, in the demo lab's main project. */
export async function loadDemoArchive(m: EntityManager, projectId: string): Promise<void> {
  const materials = [];
  for (const fields of MATERIALS) materials.push(await m.save(m.create(Material, { ...fields, projectId })));
  const [twinning, transforming] = materials as [Material, Material];

  const sample = await m.save(
    m.create(Sample, {
      projectId,
      code: 'ARB-3',
      name: 'KV-T22 / KV-M9 laminate, three bonding passes',
      description: 'Two 1.5 mm sheets stacked and roll-bonded three times at 50 %, argon anneals between passes.',
    }),
  );
  await m.insert(SampleLayer, [
    { sampleId: sample.id, position: 0, materialId: twinning.id, thicknessMm: 1.5 },
    { sampleId: sample.id, position: 1, materialId: transforming.id, thicknessMm: 1.5 },
  ]);
  const steps: RouteStep[] = [];
  for (const [position, step] of ROUTE.entries()) {
    steps.push(await m.save(m.create(RouteStep, { sampleId: sample.id, position, type: step.type, date: step.date ?? null, params: step.params ?? {}, notes: step.notes ?? '' })));
  }

  const specimens = [
    { code: 'ARB-3-P1-L', afterStep: steps[2]!, sectionPlane: 'longitudinal' as const, locations: ['interface 1, centre', 'interface 1, edge', 'layer 1 (KV-T22)'] },
    { code: 'ARB-3-P3-L', afterStep: steps[7]!, sectionPlane: 'longitudinal' as const, locations: ['interface 4, centre', 'layers 3-5'] },
    { code: 'ARB-3-T1-F', afterStep: steps[8]!, sectionPlane: 'fracture_surface' as const, locations: ['fracture surface, centre'] },
  ];
  for (const s of specimens) {
    const etched = s.sectionPlane === 'longitudinal';
    const specimen = await m.save(
      m.create(Specimen, {
        projectId,
        sampleId: sample.id,
        code: s.code,
        afterStepId: s.afterStep.id,
        sectionPlane: s.sectionPlane,
        preparation: etched
          ? { steps: ['SiC P320 → P2500', '3 µm diamond', '1 µm diamond', 'colloidal silica 0.04 µm'], etchant: '3 % nital', etchingTimeS: 8 }
          : { steps: [], etchant: '', etchingTimeS: null },
        notes: '',
      }),
    );
    for (const [i, name] of s.locations.entries()) {
      await m.insert(SpecimenLocation, { specimenId: specimen.id, name, xMm: 2 + 3 * i, yMm: 0.5 });
    }
  }
}
