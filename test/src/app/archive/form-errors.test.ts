import { expect } from 'chai';
import type { FieldProblem } from '../../../../shared/api-error';
import { controlPath, fieldProblems, formErrorText, placeFieldErrors, type ControlTree, type ErrorTarget } from '../../../../src/app/archive/form-errors';

/** A field control as the form keeps it: its errors and whether it was touched. */
class FakeControl implements ErrorTarget {
  errors: Record<string, unknown> | null = null;
  touched = false;
  constructor(readonly controls?: unknown) {}
  setErrors(errors: Record<string, unknown> | null): void {
    this.errors = errors;
  }
  markAsTouched(): void {
    this.touched = true;
  }
}

/** A form of named controls; groups and arrays carry `controls`. */
function formOf(paths: Record<string, FakeControl>): ControlTree {
  return { get: (path) => paths[path] ?? null };
}

const validationBody = (details: FieldProblem[]) => ({ error: { status: 400, code: 'validation_failed', message: 'Check the highlighted fields.', details } });

describe('client: form errors, reading the server', () => {
  it('takes the field problems of a validation failure', () => {
    const details = [{ field: 'body.code', message: 'Use letters and digits.' }];

    expect(fieldProblems(validationBody(details))).to.deep.equal(details);
  });

  it('finds none in an error without details, or in a body that is not the API shape', () => {
    expect(fieldProblems({ error: { status: 404, code: 'not_found', message: 'No such sample.' } })).to.deep.equal([]);
    expect(fieldProblems('<html>Bad gateway</html>')).to.deep.equal([]);
    expect(fieldProblems(null)).to.deep.equal([]);
  });
});

describe('client: form errors, where a problem belongs', () => {
  it('drops the request part and keeps list indices', () => {
    expect(controlPath('body.code')).to.equal('code');
    expect(controlPath('body.layers.1.thicknessMm')).to.equal('layers.1.thicknessMm');
  });

  it('puts step parameters beside the other step fields', () => {
    expect(controlPath('body.route.2.params.reductionPct')).to.equal('route.2.reductionPct');
  });

  it('follows a rename for fields the form lays out differently', () => {
    expect(controlPath('body.preparation.etchant', { 'preparation.etchant': 'etchant' })).to.equal('etchant');
  });

  it('names the whole form for a problem about the body itself', () => {
    expect(controlPath('body')).to.equal('');
  });
});

describe('client: form errors, placing them', () => {
  it('sets the message on the step field it names and marks it touched, keeping its other errors', () => {
    const reduction = new FakeControl();
    reduction.errors = { max: { max: 99 } };
    const form = formOf({ 'route.2.reductionPct': reduction });

    const leftOver = placeFieldErrors(form, [{ field: 'body.route.2.params.reductionPct', message: 'A reduction must be below 100 %.' }]);

    expect(leftOver).to.deep.equal([]);
    expect(reduction.errors).to.deep.equal({ max: { max: 99 }, server: 'A reduction must be below 100 %.' });
    expect(reduction.touched).to.equal(true);
  });

  it('hands back problems about a whole list, which has no place for a message', () => {
    const layers = new FakeControl([]);
    const form = formOf({ layers });

    const leftOver = placeFieldErrors(form, [{ field: 'body.layers', message: 'Add at least one layer.' }]);

    expect(leftOver).to.deep.equal(['Add at least one layer.']);
    expect(layers.errors).to.equal(null);
  });

  it('hands back problems about fields the form does not have, or about the body', () => {
    const leftOver = placeFieldErrors(formOf({}), [
      { field: 'body.unknown', message: 'Unknown field.' },
      { field: 'body', message: 'Send a JSON object.' },
    ]);

    expect(leftOver).to.deep.equal(['Unknown field.', 'Send a JSON object.']);
  });
});

describe('client: form errors, the sentence under the form', () => {
  const problems = [{ field: 'body.code', message: 'Use letters and digits.' }];

  it('says nothing when every problem sits beside its field', () => {
    expect(formErrorText('Check the highlighted fields.', problems, [])).to.equal('');
  });

  it('adds what no field took to the server message', () => {
    expect(formErrorText('Check the highlighted fields.', problems, ['Add at least one layer.'])).to.equal('Check the highlighted fields. Add at least one layer.');
  });

  it('does not repeat a left-over message the server sentence already holds', () => {
    expect(formErrorText('Add at least one layer.', problems, ['Add at least one layer.'])).to.equal('Add at least one layer.');
  });

  it('shows the server message alone for a failure without field problems', () => {
    expect(formErrorText('The sample code is taken.', [], [])).to.equal('The sample code is taken.');
  });
});
