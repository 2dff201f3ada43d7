import { expect } from 'chai';
import { randomUUID } from 'node:crypto';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { projectIdByCode, projectState } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';

describe('http: malformed, oversized and unknown requests', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let client: ApiClient;
  before(async () => {
    app = await mountApp();
    client = await signedIn(app.url, await makeUser());
  });
  after(() => app.close());

  const newCode = () => `RQ-${unique().toUpperCase()}`;

  it('when the body is not valid JSON, then 400 malformed_json and nothing is created', async () => {
    const code = newCode();
    const res = await client.raw('POST', '/api/projects', `{"code":"${code}","name":"Half a body"`, { 'content-type': 'application/json' });
    expectApiError(res, 400, 'malformed_json');
    expect(await projectIdByCode(code)).to.equal(null);
  });

  it('when the JSON body is a bare string, then 400 malformed_json (only objects and arrays are accepted)', async () => {
    const res = await client.raw('POST', '/api/projects', '"just a string"', { 'content-type': 'application/json' });
    expectApiError(res, 400, 'malformed_json');
  });

  it('when the body declares a charset other than UTF-8, then 400 malformed_json and nothing is created', async () => {
    const code = newCode();
    const body = JSON.stringify({ code, name: 'Latin-1 body' });
    const res = await client.raw('POST', '/api/projects', body, { 'content-type': 'application/json; charset=latin1' });
    expectApiError(res, 400, 'malformed_json');
    expect(await projectIdByCode(code)).to.equal(null);
  });

  it('when the body is larger than 100 kB, then 413 payload_too_large and nothing is created', async () => {
    const code = newCode();
    const body = JSON.stringify({ code, name: 'Huge', description: 'x'.repeat(101 * 1024) });
    const res = await client.raw('POST', '/api/projects', body, { 'content-type': 'application/json' });
    expectApiError(res, 413, 'payload_too_large');
    expect(await projectIdByCode(code)).to.equal(null);
  });

  it('when a body carries an unknown field, then 422 validation_failed naming it and nothing is created', async () => {
    const code = newCode();
    const res = await client.post('/api/projects', { code, name: 'With an extra field', budget: 1200 });
    const { details = [] } = expectApiError(res, 422, 'validation_failed');
    expect(details.some((p) => `${p.field} ${p.message}`.includes('budget'))).to.equal(true);
    expect(await projectIdByCode(code)).to.equal(null);
  });

  it('when several fields are wrong, then 422 lists every one of them', async () => {
    const res = await client.post('/api/projects', { code: 'lower case', name: 'x', description: 7 });
    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.have.members(['body.code', 'body.name', 'body.description']);
  });

  it('when a project id is not a uuid, then 422 naming params.projectId', async () => {
    for (const res of [
      await client.get('/api/projects/not-a-uuid'),
      await client.patch('/api/projects/12345', { name: 'Never applied' }),
      await client.post('/api/projects/0/members', { email: 'x@example.test', role: 'guest' }),
    ]) {
      expectApiError(res, 422, 'validation_failed');
      expect(fieldsOf(res)).to.include('params.projectId');
    }
  });

  it('when a member id is not a uuid, then 422 naming params.userId and the membership list is unchanged', async () => {
    const lead = await makeUser();
    const project = await makeProject([[lead, 'lead']]);
    const leadClient = await signedIn(app.url, lead);
    const before = await projectState(project.id);

    const res = await leadClient.delete(`/api/projects/${project.id}/members/not-a-uuid`);

    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['params.userId']);
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when a list query is out of range or unknown, then 422 naming each query field', async () => {
    const res = await client.get('/api/projects?pageSize=1000&page=-1&colour=red');
    expectApiError(res, 422, 'validation_failed');
    const fields = fieldsOf(res);
    expect(fields).to.include.members(['query.pageSize', 'query.page']);
    expect(res.body.error.details.some((d: { message: string }) => d.message.includes('colour'))).to.equal(true);
  });

  it('when a well-formed project id does not exist, then 404 not_found', async () => {
    expectApiError(await client.get(`/api/projects/${randomUUID()}`), 404, 'not_found');
  });

  it('when an /api route does not exist, then 404 not_found for signed-in and signed-out callers alike', async () => {
    const signedOut = new ApiClient(app.url);
    for (const res of [await client.get('/api/no-such-route'), await signedOut.get('/api/no-such-route'), await client.post('/api/projects/x/y/z', {})]) {
      expectApiError(res, 404, 'not_found');
    }
  });

  it('when a POST has no body at all, then 422 naming the missing fields, not a crash', async () => {
    const res = await client.post('/api/projects');
    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.have.members(['body.code', 'body.name']);
  });
});
