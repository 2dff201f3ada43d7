import { expect } from 'chai';
import { processStepSchema, STEP_TYPES, type ProcessStep } from '../../../../shared/archive/process-route';
import {
  emptyStep,
  isParamRequired,
  layerBody,
  paramFieldsFor,
  previewStates,
  stepBody,
  stepFormValue,
  stepParams,
  type StepFormValue,
} from '../../../../src/app/archive/sample-form-model';

const step = (change: Partial<StepFormValue>): StepFormValue => ({ ...emptyStep(change.type), ...change });

describe('client: sample form, fields per step type', () => {
  it('marks as required exactly the parameters the server refuses to do without', () => {
    for (const type of STEP_TYPES) {
      const result = processStepSchema.safeParse({ type, params: {} });
      const serverNeeds = (result.error?.issues ?? []).map((i) => String(i.path.at(-1))).sort();
      const formNeeds = paramFieldsFor(type).filter((f) => isParamRequired(type, f)).sort();

      expect(formNeeds, type).to.deep.equal(serverNeeds);
    }
  });

  it('shows only fields the server accepts for the type, so a full form saves', () => {
    const full: StepFormValue = { ...emptyStep(), reductionPct: 50, pieces: 2, temperatureC: 800, timeMin: 30, atmosphere: 'argon', details: 'brushed' };
    for (const type of STEP_TYPES) {
      const result = processStepSchema.safeParse(stepBody({ ...full, type }));

      expect(result.success, `${type}: ${result.error?.message}`).to.equal(true);
    }
  });

  it('asks a rolling pass for its reduction and an anneal for temperature, time and atmosphere', () => {
    expect(paramFieldsFor('roll_bonding')).to.include('reductionPct');
    expect(paramFieldsFor('anneal')).to.include.members(['temperatureC', 'timeMin', 'atmosphere']);
    expect(paramFieldsFor('anneal')).not.to.include('reductionPct');
    expect(paramFieldsFor('cut_and_stack')).to.include('pieces');
  });

  it('requires nothing of a tensile test or a surface preparation', () => {
    expect(isParamRequired('tensile_test', 'details')).to.equal(false);
    expect(isParamRequired('surface_preparation', 'details')).to.equal(false);
    expect(isParamRequired('anneal', 'atmosphere')).to.equal(false);
  });
});

describe('client: sample form, step values', () => {
  it('starts a new step as an unsaved roll-bonding pass with blank fields', () => {
    expect(emptyStep()).to.deep.equal({
      id: null,
      type: 'roll_bonding',
      date: '',
      reductionPct: null,
      pieces: null,
      temperatureC: null,
      timeMin: null,
      atmosphere: '',
      details: '',
      notes: '',
    });
  });

  it('starts a new cut-and-stack at two pieces', () => {
    expect(emptyStep('cut_and_stack').pieces).to.equal(2);
  });

  it('keeps a saved step unchanged through the form and back, id included', () => {
    const saved: ProcessStep = { id: 'b1c1', type: 'anneal', date: '2026-03-14', params: { temperatureC: 800, timeMin: 30, atmosphere: 'argon' }, notes: 'slow cool' };

    expect(stepBody(stepFormValue(saved))).to.deep.equal(saved);
  });

  it('sends a new step without id and a blank date as null, with notes trimmed', () => {
    const body = stepBody(step({ reductionPct: 50, notes: '  first pass ' }));

    expect(body).to.deep.equal({ type: 'roll_bonding', date: null, params: { reductionPct: 50 }, notes: 'first pass' });
    expect(body).not.to.have.property('id');
  });

  it('drops parameters that belong to another type, left over after the type was changed', () => {
    const changed = step({ type: 'anneal', reductionPct: 50, pieces: 4, temperatureC: 800, timeMin: 30 });

    expect(stepParams(changed)).to.deep.equal({ temperatureC: 800, timeMin: 30 });
  });

  it('leaves out blank text and numbers that are not numbers, and trims the rest', () => {
    const params = stepParams(step({ type: 'anneal', temperatureC: Number.NaN, timeMin: 0, atmosphere: '  N2 ' }));

    expect(params).to.deep.equal({ timeMin: 0, atmosphere: 'N2' });
    expect(stepParams(step({ type: 'other', details: '   ' }))).to.deep.equal({});
  });

  it('sends a layer without a thickness as 0 mm, for the server to refuse', () => {
    expect(layerBody({ materialId: 'm1', thicknessMm: null })).to.deep.equal({ materialId: 'm1', thicknessMm: 0 });
    expect(layerBody({ materialId: 'm1', thicknessMm: 1.5 })).to.deep.equal({ materialId: 'm1', thicknessMm: 1.5 });
  });
});

describe('client: sample form, live preview', () => {
  const layers = [
    { materialId: 'a', thicknessMm: 1.5 },
    { materialId: 'b', thicknessMm: 1.5 },
  ];

  it('previews a complete route like the server computes it', () => {
    // Two 50 % passes with a cut between: 4 layers of 0.375 mm, strain 2 × 0.8004 = 1.6008
    // (Saito et al., Acta Mater. 47 (1999) 579).
    const states = previewStates(layers, [step({ reductionPct: 50 }), step({ type: 'cut_and_stack' }), step({ reductionPct: 50 })]);
    const last = states.at(-1)!;

    expect(states).to.have.length(4);
    expect(last.layerCount).to.equal(4);
    expect(last.originalLayerThicknessMm).to.deep.equal([0.375, 0.375]);
    expect(last.totalThicknessMm).to.equal(1.5);
    expect(last.vonMisesStrain).to.be.closeTo(1.6008, 1e-4);
  });

  it('leaves out layers without a material or a positive thickness', () => {
    const states = previewStates([...layers, { materialId: '', thicknessMm: 1 }, { materialId: 'c', thicknessMm: null }, { materialId: 'd', thicknessMm: 0 }], []);

    expect(states[0]!.layerCount).to.equal(2);
    expect(states[0]!.totalThicknessMm).to.equal(3);
  });

  it('treats a reduction being typed (0, 100 or more) as no reduction instead of failing', () => {
    for (const reductionPct of [0, 100, 150, -5]) {
      const states = previewStates(layers, [step({ reductionPct })]);

      expect(states[1]!.totalThicknessMm, `${reductionPct} %`).to.equal(3);
      expect(states[1]!.vonMisesStrain, `${reductionPct} %`).to.equal(0);
    }
  });

  it('stacks two pieces while the piece count is not yet a whole number of at least 2', () => {
    for (const pieces of [1, 2.5, null]) {
      const states = previewStates(layers, [step({ type: 'cut_and_stack', pieces })]);

      expect(states[1]!.layerCount, `${pieces} pieces`).to.equal(4);
    }
    expect(previewStates(layers, [step({ type: 'cut_and_stack', pieces: 3 })])[1]!.layerCount).to.equal(6);
  });

  it('previews nothing but the empty stack when no layer is complete', () => {
    const states = previewStates([{ materialId: '', thicknessMm: null }], [step({ reductionPct: 50 })]);

    expect(states.map((s) => s.layerCount)).to.deep.equal([0, 0]);
  });
});
