import { expect } from 'chai';
import { apiErrorMessage, fieldKey } from '../../../../src/app/core/api-error-message';

const body = (code: string, message: string, details?: { field: string; message: string }[]) => ({ error: { status: 400, code, message, ...(details ? { details } : {}) } });

describe('client: api error message, the server’s own errors', () => {
  it('shows the server’s sentence and code for an error in the API shape', () => {
    const failure = apiErrorMessage({ status: 409, error: body('conflict', 'A sample with code ARB-3 exists in this project.') });

    expect(failure).to.deep.equal({ message: 'A sample with code ARB-3 exists in this project.', fieldErrors: {}, code: 'conflict', status: 409 });
  });

  it('keys field problems by the last part of their path', () => {
    const failure = apiErrorMessage({
      status: 400,
      error: body('validation_failed', 'Check the highlighted fields.', [
        { field: 'body.email', message: 'Enter a valid e-mail address.' },
        { field: 'body.members.0.role', message: 'Choose a role.' },
      ]),
    });

    expect(failure.fieldErrors).to.deep.equal({ email: 'Enter a valid e-mail address.', role: 'Choose a role.' });
  });

  it('keeps the first message when one field has several', () => {
    const failure = apiErrorMessage({
      status: 400,
      error: body('validation_failed', 'Check the fields.', [
        { field: 'body.password', message: 'Use at least 12 characters.' },
        { field: 'body.password', message: 'Use a less common password.' },
      ]),
    });

    expect(failure.fieldErrors).to.deep.equal({ password: 'Use at least 12 characters.' });
  });
});

describe('client: api error message, failures that are not ours', () => {
  it('explains a request that never reached the server', () => {
    const failure = apiErrorMessage({ status: 0, error: { type: 'error', loaded: 0, total: 0 } });

    expect(failure.code).to.equal(null);
    expect(failure.message).to.contain('cannot be reached');
  });

  it('asks to wait after too many attempts', () => {
    expect(apiErrorMessage({ status: 429, error: 'Too Many Requests' }).message).to.contain('Wait a minute');
  });

  it('names the status of a server failure behind a proxy page', () => {
    const failure = apiErrorMessage({ status: 502, error: '<html><body>Bad Gateway</body></html>' });

    expect(failure.message).to.contain('HTTP 502');
    expect(failure).to.include({ code: null, status: 502 });
    expect(failure.fieldErrors).to.deep.equal({});
  });

  it('names the status of any other refusal', () => {
    expect(apiErrorMessage({ status: 413, error: null }).message).to.equal('The request was refused (HTTP 413).');
  });

  it('does not take a body with an error of another shape for ours', () => {
    expect(apiErrorMessage({ status: 400, error: { error: 'Bad Request' } }).code).to.equal(null);
  });
});

describe('client: api error message, field keys', () => {
  it('takes the last named part of a path, skipping list indices', () => {
    expect(fieldKey('body.email')).to.equal('email');
    expect(fieldKey('body.members.0.role')).to.equal('role');
    expect(fieldKey('query.page')).to.equal('page');
    expect(fieldKey('body.route.2')).to.equal('route');
  });

  it('gives the whole form for a problem about a request part itself', () => {
    expect(fieldKey('body')).to.equal('');
    expect(fieldKey('query')).to.equal('');
    expect(fieldKey('params')).to.equal('');
    expect(fieldKey('')).to.equal('');
  });

  it('keeps a bare field name that is not a request part', () => {
    expect(fieldKey('email')).to.equal('email');
  });
});
