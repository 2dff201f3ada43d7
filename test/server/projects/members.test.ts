import { expect } from 'chai';
import { randomUUID } from 'node:crypto';
import type { User } from '../../../server/auth/user.entity';
import type { Project } from '../../../server/projects/project.entity';
import { type ApiClient, mountApp } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { projectState, sql } from '../db-state';
import { expectApiError, fieldsOf } from '../error-shape';

describe('projects: members', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  /** A project whose only lead is signed in, with one researcher. */
  async function arrange(): Promise<{ lead: User; researcher: User; project: Project; client: ApiClient }> {
    const lead = await makeUser();
    const researcher = await makeUser();
    const project = await makeProject([[lead, 'lead'], [researcher, 'researcher']]);
    return { lead, researcher, project, client: await signedIn(app.url, lead) };
  }

  const roleOf = async (projectId: string, userId: string) =>
    ((await sql('SELECT role FROM project_memberships WHERE project_id = $1 AND user_id = $2', [projectId, userId]))[0]?.['role'] as string | undefined) ?? null;

  it('when the lead adds someone by e-mail (any case), then 201 with the member, and the project lists them', async () => {
    const { project, client } = await arrange();
    const newcomer = await makeUser();

    const res = await client.post(`/api/projects/${project.id}/members`, { email: newcomer.email.toUpperCase(), role: 'reviewer' });

    expect(res.status).to.equal(201);
    expect(res.body).to.include({ userId: newcomer.id, email: newcomer.email, displayName: newcomer.displayName, role: 'reviewer' });
    expect(await roleOf(project.id, newcomer.id)).to.equal('reviewer');
    expect((await client.get(`/api/projects/${project.id}`)).body.memberCount).to.equal(3);
  });

  it('when the e-mail has no account, then 404 naming body.email and nothing changes', async () => {
    const { project, client } = await arrange();
    const before = await projectState(project.id);

    const res = await client.post(`/api/projects/${project.id}/members`, { email: `nobody-${unique()}@example.test`, role: 'guest' });

    expectApiError(res, 404, 'not_found');
    expect(fieldsOf(res)).to.deep.equal(['body.email']);
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the person is already a member, then 409 and their role stays', async () => {
    const { project, researcher, client } = await arrange();
    const before = await projectState(project.id);

    const res = await client.post(`/api/projects/${project.id}/members`, { email: researcher.email, role: 'guest' });

    expectApiError(res, 409, 'conflict');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the account is deactivated, then 409 and nobody is added', async () => {
    const { project, client } = await arrange();
    const inactive = await makeUser('member', { active: false });
    const before = await projectState(project.id);

    const res = await client.post(`/api/projects/${project.id}/members`, { email: inactive.email, role: 'guest' });

    expectApiError(res, 409, 'conflict');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the role is not a project role, then 422 naming body.role and nobody is added', async () => {
    const { project, client } = await arrange();
    const newcomer = await makeUser();
    const before = await projectState(project.id);

    const res = await client.post(`/api/projects/${project.id}/members`, { email: newcomer.email, role: 'admin' });

    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.deep.equal(['body.role']);
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the lead changes a member\'s role, then 200 and the new role is stored', async () => {
    const { project, researcher, client } = await arrange();

    const res = await client.patch(`/api/projects/${project.id}/members/${researcher.id}`, { role: 'guest' });

    expect(res.status).to.equal(200);
    expect(res.body).to.include({ userId: researcher.id, role: 'guest' });
    expect(await roleOf(project.id, researcher.id)).to.equal('guest');
  });

  it('when the user is not a member of this project, then changing or removing them is 404 and nothing changes', async () => {
    const { project, client } = await arrange();
    const outsider = await makeUser();
    const before = await projectState(project.id);

    const patch = await client.patch(`/api/projects/${project.id}/members/${outsider.id}`, { role: 'guest' });
    const remove = await client.delete(`/api/projects/${project.id}/members/${randomUUID()}`);

    expectApiError(patch, 404, 'not_found');
    expectApiError(remove, 404, 'not_found');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the lead removes a member, then 204 and the project disappears for that member', async () => {
    const { project, researcher, client } = await arrange();
    const researcherClient = await signedIn(app.url, researcher);
    expect((await researcherClient.get(`/api/projects/${project.id}`)).status).to.equal(200);

    const res = await client.delete(`/api/projects/${project.id}/members/${researcher.id}`);

    expect(res.status).to.equal(204);
    expect(await roleOf(project.id, researcher.id)).to.equal(null);
    expectApiError(await researcherClient.get(`/api/projects/${project.id}`), 404, 'not_found');
  });

  it('when the only lead demotes themself, then 409 and they stay lead', async () => {
    const { project, lead, client } = await arrange();
    const before = await projectState(project.id);

    const res = await client.patch(`/api/projects/${project.id}/members/${lead.id}`, { role: 'researcher' });

    expect(expectApiError(res, 409, 'conflict').message).to.match(/at least one lead/);
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when the only lead removes themself, then 409 and the membership stays', async () => {
    const { project, lead, client } = await arrange();
    const before = await projectState(project.id);

    const res = await client.delete(`/api/projects/${project.id}/members/${lead.id}`);

    expectApiError(res, 409, 'conflict');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when a site admin tries to demote or remove the last lead, then 409 too', async () => {
    const { project, lead } = await arrange();
    const admin = await signedIn(app.url, await makeUser('admin'));
    const before = await projectState(project.id);

    expectApiError(await admin.patch(`/api/projects/${project.id}/members/${lead.id}`, { role: 'guest' }), 409, 'conflict');
    expectApiError(await admin.delete(`/api/projects/${project.id}/members/${lead.id}`), 409, 'conflict');
    expect(await projectState(project.id)).to.deep.equal(before);
  });

  it('when there is a second lead, then a lead may step down and then leave', async () => {
    const { project, lead, researcher, client } = await arrange();
    expect((await client.patch(`/api/projects/${project.id}/members/${researcher.id}`, { role: 'lead' })).status).to.equal(200);

    const stepDown = await client.patch(`/api/projects/${project.id}/members/${lead.id}`, { role: 'guest' });
    const leave = await signedIn(app.url, researcher).then((c) => c.delete(`/api/projects/${project.id}/members/${lead.id}`));

    expect(stepDown.status).to.equal(200);
    expect(leave.status).to.equal(204);
    expect(await sql('SELECT user_id, role FROM project_memberships WHERE project_id = $1', [project.id])).to.deep.equal([{ user_id: researcher.id, role: 'lead' }]);
  });

  it('when two leads demote each other at the same moment, then one succeeds and one lead remains', async () => {
    const { project, lead, researcher, client } = await arrange();
    await sql(`UPDATE project_memberships SET role = 'lead' WHERE project_id = $1 AND user_id = $2`, [project.id, researcher.id]);
    const other = await signedIn(app.url, researcher);

    const results = await Promise.all([
      client.patch(`/api/projects/${project.id}/members/${researcher.id}`, { role: 'guest' }),
      other.patch(`/api/projects/${project.id}/members/${lead.id}`, { role: 'guest' }),
    ]);

    // The loser is refused either by the access check (already demoted: 403) or by the last-lead rule (409).
    const [first, second] = results.map((r) => r.status).sort();
    expect(first).to.equal(200);
    expect(second).to.be.oneOf([403, 409]);
    expect(await sql(`SELECT 1 FROM project_memberships WHERE project_id = $1 AND role = 'lead'`, [project.id])).to.have.length(1);
  });
});
