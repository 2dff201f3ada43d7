import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import type { Project } from '../../../server/projects/project.entity';
import type { ProjectSummary } from '../../../shared/projects';
import { type ApiClient, mountApp } from '../../support/api-client';
import { makeProject, makeUser, signedIn, unique } from '../../support/fixtures';
import { sql } from '../db-state';

describe('projects: the list is paged, sorted and filtered on the server', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  /** A member of five projects (two archived) and a project they are not in, all tagged with one unique word. */
  async function arrange(): Promise<{ tag: string; me: User; client: ApiClient; mine: Project[]; foreign: Project }> {
    const tag = unique();
    const me = await makeUser();
    const other = await makeUser();
    const specs: [string, string, 'active' | 'archived', string][] = [
      ['Charpy notch series', 'C', 'active', 'impact toughness'],
      ['Austenite grain growth', 'A', 'active', 'anneal series 100% reduction'],
      ['Etch pit density', 'E', 'archived', 'dislocations'],
      ['Bainite fractions', 'B', 'active', 'point counting'],
      ['Dendrite arm spacing', 'D', 'archived', 'castings'],
    ];
    const mine: Project[] = [];
    for (const [name, letter, status, description] of specs) {
      mine.push(await makeProject([[me, 'guest'], [other, 'lead']], { name: `${name} ${tag}`, code: `${letter}-${tag.toUpperCase()}`, status, description }));
    }
    const foreign = await makeProject([[other, 'lead']], { name: `Foreign study ${tag}`, code: `F-${tag.toUpperCase()}` });
    return { tag, me, client: await signedIn(app.url, me), mine, foreign };
  }

  const names = (items: ProjectSummary[]) => items.map((p) => p.name.split(' ').slice(0, -1).join(' '));

  it('when a member lists with defaults, then only their active projects appear, sorted by name, with the total', async () => {
    const { client } = await arrange();

    const res = await client.get('/api/projects');

    expect(res.status).to.equal(200);
    expect(names(res.body.items)).to.deep.equal(['Austenite grain growth', 'Bainite fractions', 'Charpy notch series']);
    expect(res.body).to.include({ total: 3, page: 0, pageSize: 20 });
  });

  it('when a member lists all statuses, then projects they do not belong to are still left out', async () => {
    const { client, mine, foreign } = await arrange();

    const res = await client.get('/api/projects?status=all');

    expect(res.body.total).to.equal(5);
    expect(res.body.items.map((p: ProjectSummary) => p.id)).to.have.members(mine.map((p) => p.id));
    expect(res.body.items.map((p: ProjectSummary) => p.id)).to.not.include(foreign.id);
  });

  it('when pages of two are asked for, then the pages are disjoint, in order, and each carries the full total', async () => {
    const { client } = await arrange();

    const pages = [];
    for (const page of [0, 1, 2, 3]) pages.push((await client.get(`/api/projects?status=all&pageSize=2&page=${page}`)).body);

    expect(pages.map((p) => names(p.items))).to.deep.equal([
      ['Austenite grain growth', 'Bainite fractions'],
      ['Charpy notch series', 'Dendrite arm spacing'],
      ['Etch pit density'],
      [],
    ]);
    expect(pages.map((p) => p.total)).to.deep.equal([5, 5, 5, 5]);
    expect(pages.map((p) => p.page)).to.deep.equal([0, 1, 2, 3]);
  });

  it('when sorted by name descending, then the order reverses', async () => {
    const { client } = await arrange();
    const res = await client.get('/api/projects?status=all&sort=name&dir=desc');
    expect(names(res.body.items)).to.deep.equal(['Etch pit density', 'Dendrite arm spacing', 'Charpy notch series', 'Bainite fractions', 'Austenite grain growth']);
  });

  it('when sorted by code, status or creation time, then the server orders by that column', async () => {
    const { client, mine } = await arrange();
    // Spread the creation times so the order is unambiguous: the first made is the oldest.
    for (const [i, p] of mine.entries()) await sql(`UPDATE projects SET created_at = now() - ($1 || ' hours')::interval WHERE id = $2`, [10 - i, p.id]);

    const byCode = await client.get('/api/projects?status=all&sort=code');
    const byStatus = await client.get('/api/projects?status=all&sort=status&dir=desc');
    const byCreated = await client.get('/api/projects?status=all&sort=createdAt&dir=desc');

    expect(byCode.body.items.map((p: ProjectSummary) => p.code[0])).to.deep.equal(['A', 'B', 'C', 'D', 'E']);
    expect(byStatus.body.items.map((p: ProjectSummary) => p.status)).to.deep.equal(['archived', 'archived', 'active', 'active', 'active']);
    expect(byCreated.body.items.map((p: ProjectSummary) => p.id)).to.deep.equal(mine.map((p) => p.id).reverse());
  });

  it('when filtered by status, then only that status is counted and listed', async () => {
    const { client } = await arrange();
    const res = await client.get('/api/projects?status=archived');
    expect(names(res.body.items)).to.deep.equal(['Dendrite arm spacing', 'Etch pit density']);
    expect(res.body.total).to.equal(2);
  });

  it('when searched with q, then name, code and description match without regard to case', async () => {
    const { client, tag } = await arrange();

    const byName = await client.get('/api/projects?status=all&q=BAINITE');
    const byCode = await client.get(`/api/projects?status=all&q=e-${tag}`);
    const byDescription = await client.get('/api/projects?status=all&q=castings');

    expect(names(byName.body.items)).to.deep.equal(['Bainite fractions']);
    expect(names(byCode.body.items)).to.deep.equal(['Etch pit density']);
    expect(names(byDescription.body.items)).to.deep.equal(['Dendrite arm spacing']);
    expect([byName, byCode, byDescription].map((r) => r.body.total)).to.deep.equal([1, 1, 1]);
  });

  it('when q holds LIKE wildcards, then they match literally', async () => {
    const { client } = await arrange();
    const percent = await client.get(`/api/projects?status=all&q=${encodeURIComponent('100%')}`);
    const underscore = await client.get(`/api/projects?status=all&q=${encodeURIComponent('_')}`);
    expect(names(percent.body.items)).to.deep.equal(['Austenite grain growth']);
    expect(underscore.body.total).to.equal(0);
  });

  it('when a member lists, then each row carries their role and the member count', async () => {
    const { client } = await arrange();
    const res = await client.get('/api/projects?status=all&pageSize=1');
    expect(res.body.items[0]).to.include({ myRole: 'guest', memberCount: 2 });
  });

  it('when a site admin lists, then projects they are not in appear too, with no role of their own', async () => {
    const { tag, mine, foreign } = await arrange();
    const admin = await signedIn(app.url, await makeUser('admin'));

    const res = await admin.get(`/api/projects?status=all&q=${tag}`);

    expect(res.body.total).to.equal(6);
    expect(res.body.items.map((p: ProjectSummary) => p.id)).to.have.members([...mine, foreign].map((p) => p.id));
    expect(res.body.items.every((p: ProjectSummary) => p.myRole === null)).to.equal(true);
  });

  it('when a user belongs to no project, then the list is empty with total 0', async () => {
    const client = await signedIn(app.url, await makeUser());
    const res = await client.get('/api/projects?status=all');
    expect(res.body).to.deep.equal({ items: [], total: 0, page: 0, pageSize: 20 });
  });
});
