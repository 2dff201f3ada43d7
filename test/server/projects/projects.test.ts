import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { PERMISSIONS, PROJECT_ACTIONS } from '../../../shared/roles';
import { projectState, sql } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';

describe('projects: create, edit and archive', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  const newCode = () => `PX-${unique().toUpperCase()}`;
  const projectsWithCode = async (code: string) => sql('SELECT id, name FROM projects WHERE code = $1', [code]);

  it('when a member creates a project, then 201 and they are its only member, as lead, with the rights of a lead', async () => {
    const creator = await makeUser();
    const client = await signedIn(app.url, creator);
    const code = newCode();

    const res = await client.post('/api/projects', { code, name: '  Oxide chains at bond lines  ', description: 'Cross-sections after the third pass.' });

    expect(res.status).to.equal(201);
    expect(res.body).to.include({ code, name: 'Oxide chains at bond lines', status: 'active', myRole: 'lead', memberCount: 1 });
    expect(res.body.members.map((m: { userId: string; role: string }) => [m.userId, m.role])).to.deep.equal([[creator.id, 'lead']]);
    expect(res.body.allowed).to.deep.equal(PROJECT_ACTIONS.filter((a) => PERMISSIONS[a].includes('lead')));
    expect(await projectsWithCode(code)).to.deep.equal([{ id: res.body.id, name: 'Oxide chains at bond lines' }]);
  });

  it('when the code is already taken, then 409 naming body.code and nothing new is stored', async () => {
    const existing = await makeProject([[await makeUser(), 'lead']]);
    const creator = await makeUser();
    const client = await signedIn(app.url, creator);
    const before = await projectState(existing.id);

    const res = await client.post('/api/projects', { code: existing.code, name: 'Second use of a code' });

    expectApiError(res, 409, 'conflict');
    expect(fieldsOf(res)).to.deep.equal(['body.code']);
    expect(await projectState(existing.id)).to.deep.equal(before);
    expect(await sql('SELECT 1 FROM project_memberships WHERE user_id = $1', [creator.id])).to.have.length(0);
  });

  it('when the code is in lower case, then 422 naming body.code and nothing is stored', async () => {
    const client = await signedIn(app.url, await makeUser());
    const code = `px-${unique()}`;
    const res = await client.post('/api/projects', { code, name: 'Lower-case code' });
    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['body.code']);
    expect(await sql('SELECT 1 FROM projects WHERE lower(code) = lower($1)', [code])).to.have.length(0);
  });

  it('when the lead renames the project and changes its description, then 200 and both are stored', async () => {
    const lead = await makeUser();
    const project = await makeProject([[lead, 'lead']]);
    const client = await signedIn(app.url, lead);
    const before = (await sql('SELECT updated_at FROM projects WHERE id = $1', [project.id]))[0]!['updated_at'] as Date;

    const res = await client.patch(`/api/projects/${project.id}`, { name: 'Layer thickness after ten passes', description: 'Now with EBSD maps.' });

    expect(res.status).to.equal(200);
    expect(res.body).to.include({ name: 'Layer thickness after ten passes', description: 'Now with EBSD maps.', code: project.code });
    const [row] = await sql('SELECT name, description, updated_at FROM projects WHERE id = $1', [project.id]);
    expect(row).to.include({ name: 'Layer thickness after ten passes', description: 'Now with EBSD maps.' });
    expect((row!['updated_at'] as Date).getTime()).to.be.greaterThan(before.getTime());
  });

  it('when the lead archives the project, then it leaves the default list and shows under archived; unarchiving brings it back', async () => {
    const lead = await makeUser();
    const project = await makeProject([[lead, 'lead']]);
    const client = await signedIn(app.url, lead);

    const archived = await client.patch(`/api/projects/${project.id}`, { status: 'archived' });
    const activeList = await client.get('/api/projects');
    const archivedList = await client.get('/api/projects?status=archived');
    const restored = await client.patch(`/api/projects/${project.id}`, { status: 'active' });

    expect(archived.status).to.equal(200);
    expect(archived.body.status).to.equal('archived');
    expect(activeList.body.total).to.equal(0);
    expect(archivedList.body.items.map((p: { id: string }) => p.id)).to.deep.equal([project.id]);
    expect(restored.body.status).to.equal('active');
    expect((await sql('SELECT status FROM projects WHERE id = $1', [project.id]))[0]).to.deep.equal({ status: 'active' });
  });

  for (const [what, body, field] of [
    ['an unknown status', { status: 'deleted' }, 'body.status'],
    ['a name too short', { name: 'ab' }, 'body.name'],
    ['the code, which cannot be edited', { code: 'NEW-CODE' }, 'body'],
    ['nothing at all', {}, 'body'],
  ] as const) {
    it(`when the lead sends ${what}, then 422 naming ${field} and the project is unchanged`, async () => {
      const lead = await makeUser();
      const project = await makeProject([[lead, 'lead']]);
      const client = await signedIn(app.url, lead);
      const before = await projectState(project.id);

      const res = await client.patch(`/api/projects/${project.id}`, body);

      expectApiError(res, 422, 'validation_failed');
      expect(fieldsOf(res)).to.include(field);
      expect(await projectState(project.id)).to.deep.equal(before);
    });
  }
});
