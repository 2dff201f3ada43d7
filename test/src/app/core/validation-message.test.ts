import { expect } from 'chai';
import { validationMessage } from '../../../../src/app/core/validation-message';

describe('client: validation message', () => {
  it('says nothing for a valid control', () => {
    expect(validationMessage(null)).to.equal('');
    expect(validationMessage(undefined)).to.equal('');
  });

  it('prefers the server’s message over the client’s own checks', () => {
    expect(validationMessage({ required: true, server: 'This code is taken.' })).to.equal('This code is taken.');
  });

  it('words the common checks', () => {
    expect(validationMessage({ required: true })).to.equal('Required.');
    expect(validationMessage({ email: true })).to.equal('Enter a valid e-mail address.');
    expect(validationMessage({ mismatch: true })).to.equal('The two passwords differ.');
    expect(validationMessage({ pattern: { requiredPattern: '^[A-Z]+$', actualValue: 'a' } })).to.equal('Check the format.');
  });

  it('names the length a field needs', () => {
    expect(validationMessage({ minlength: { requiredLength: 12, actualLength: 5 } })).to.equal('Use at least 12 characters.');
    expect(validationMessage({ maxlength: { requiredLength: 100, actualLength: 101 } })).to.equal('Use at most 100 characters.');
  });

  it('asks for the missing value before judging its form', () => {
    expect(validationMessage({ email: true, required: true })).to.equal('Required.');
  });

  it('shows a custom validator’s own sentence', () => {
    expect(validationMessage({ notElement: 'Xx is not a chemical element symbol.' })).to.equal('Xx is not a chemical element symbol.');
  });

  it('falls back to a neutral request for an unknown error without text', () => {
    expect(validationMessage({ min: { min: 0, actual: -1 } })).to.equal('Check this field.');
  });
});
