import { expect } from 'chai';
import { Image } from '../../../server/images/image.entity';
import { mountApp } from '../../support/api-client';
import { makeUser, unique } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { ProjectMembership } from '../../../server/projects/project-membership.entity';
import { RouteStep } from '../../../server/archive/route-step.entity';
import { Specimen } from '../../../server/archive/specimen.entity';
import { Sample } from '../../../server/archive/sample.entity';
import { expectApiError, fieldsOf } from '../error-shape';
import { archiveScene, type ArchiveScene } from './image-fixtures';

/** Inserts an image row directly (search needs rows, not files); every other field is a plain default. */
async function row(s: ArchiveScene, fields: Partial<Image>): Promise<Image> {
  const repo = runningServer().ctx.dataSource.getRepository(Image);
  const sha = (unique() + unique() + unique() + unique() + unique() + unique() + unique() + unique()).slice(0, 64);
  return repo.save(
    repo.create({
      projectId: s.project.id,
      specimenId: s.specimenId,
      uploaderId: s.user.id,
      modality: 'lom_bright_field',
      originalName: `${unique()}.tif`,
      sha256: sha,
      byteSize: '1000',
      format: 'tiff',
      width: 100,
      height: 100,
      bitDepth: 8,
      channels: 1,
      originalKey: `projects/${s.project.id}/originals/${sha}`,
      ...fields,
    }),
  );
}

describe('images: search over a project, filtered, sorted and paged on the server', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ArchiveScene;
  let other: { sampleId: string; specimenId: string; stepId: string };
  const ids: Record<string, string> = {};

  before(async () => {
    app = await mountApp();
    s = await archiveScene(app.url);
    const ds = runningServer().ctx.dataSource;
    // A second sample (no layer of the scene's material) cut after a route step.
    const sample = await ds.getRepository(Sample).save({ projectId: s.project.id, code: `S2-${unique()}`, name: 'Other' });
    const step = await ds.getRepository(RouteStep).save({ sampleId: sample.id, position: 0, type: 'anneal', params: { temperatureC: 700, timeMin: 30 } });
    const specimen = await ds.getRepository(Specimen).save({ projectId: s.project.id, sampleId: sample.id, code: 'X1', afterStepId: step.id, sectionPlane: 'transverse', preparation: { steps: [], etchant: '', etchingTimeS: null } });
    other = { sampleId: sample.id, specimenId: specimen.id, stepId: step.id };
    const second = await makeUser();
    await ds.getRepository(ProjectMembership).insert({ projectId: s.project.id, userId: second.id, role: 'researcher' });
    ids['a'] = (await row(s, { locationId: s.locationId, modality: 'sem_secondary', magnification: 500, pixelSizeUm: 0.2, tags: ['interface', 'etched'], notes: 'Oxide chain along interface 2', acquiredAt: new Date('2025-03-01T10:00:00Z'), originalName: 'alpha.tif', uploadedAt: new Date('2025-04-01T00:00:00Z') })).id;
    ids['b'] = (await row(s, { modality: 'lom_bright_field', magnification: 100, pixelSizeUm: 1.1, tags: ['etched'], notes: 'overview', acquiredAt: new Date('2025-03-15T10:00:00Z'), originalName: 'bravo.tif', state: 'ready', pyramidLevels: 8, uploadedAt: new Date('2025-04-02T00:00:00Z') })).id;
    ids['c'] = (await row(s, { specimenId: specimen.id, modality: 'ebsd_phase', magnification: 2000, pixelSizeUm: 0.05, notes: '50% martensite_ish', originalName: 'charlie.tif', uploaderId: second.id, state: 'failed', failureReason: 'bad', uploadedAt: new Date('2025-04-03T00:00:00Z') })).id;
  });
  after(() => app.close());

  const search = async (query: string) => {
    const res = await s.client.get(`/api/projects/${s.project.id}/images?${query}`);
    expect(res.status, JSON.stringify(res.body)).to.equal(200);
    return res.body as { items: { id: string }[]; total: number };
  };
  const names = (body: { items: { id: string }[] }) => body.items.map((i) => Object.entries(ids).find(([, id]) => id === i.id)?.[0]);

  it('when nothing is filtered, then every image of the project comes newest first with the total', async () => {
    const body = await search('');
    expect(names(body)).to.deep.equal(['c', 'b', 'a']);
    expect(body.total).to.equal(3);
  });

  it('when filtered by sample, material, process step, specimen or location, then only images hung there match', async () => {
    expect(names(await search(`sampleId=${s.sampleId}`))).to.have.members(['a', 'b']);
    expect(names(await search(`materialId=${s.materialId}`))).to.have.members(['a', 'b']);
    expect(names(await search(`stepId=${other.stepId}`))).to.deep.equal(['c']);
    expect(names(await search(`specimenId=${other.specimenId}`))).to.deep.equal(['c']);
    expect(names(await search(`locationId=${s.locationId}`))).to.deep.equal(['a']);
  });

  it('when filtered by modality (one or several), then only those match', async () => {
    expect(names(await search('modality=sem_secondary'))).to.deep.equal(['a']);
    expect(names(await search('modality=sem_secondary,ebsd_phase'))).to.have.members(['a', 'c']);
    expect(names(await search('modality=sem_secondary&modality=lom_bright_field'))).to.have.members(['a', 'b']);
  });

  it('when filtered by magnification and pixel-size ranges, then the ends are included', async () => {
    expect(names(await search('magnificationMin=100&magnificationMax=500'))).to.have.members(['a', 'b']);
    expect(names(await search('pixelSizeMinUm=0.05&pixelSizeMaxUm=0.2'))).to.have.members(['a', 'c']);
  });

  it('when filtered by tags, then images carrying every tag match', async () => {
    expect(names(await search('tags=etched'))).to.have.members(['a', 'b']);
    expect(names(await search('tags=etched,interface'))).to.deep.equal(['a']);
  });

  it('when filtered by acquisition dates, then both ends are whole days', async () => {
    expect(names(await search('acquiredFrom=2025-03-01&acquiredTo=2025-03-01'))).to.deep.equal(['a']);
    expect(names(await search('acquiredFrom=2025-03-02'))).to.deep.equal(['b']);
  });

  it('when filtered by uploader, processing state or text, then those match; LIKE wildcards match literally', async () => {
    const [c] = (await search('uploaderId=' + (await runningServer().ctx.dataSource.query('SELECT uploader_id FROM images WHERE id = $1', [ids['c']]))[0].uploader_id)).items;
    expect(c!.id).to.equal(ids['c']);
    expect(names(await search('state=ready,failed'))).to.have.members(['b', 'c']);
    expect(names(await search('q=OXIDE'))).to.deep.equal(['a']);
    expect(names(await search('q=charlie'))).to.deep.equal(['c']);
    expect(names(await search('q=50%25'))).to.deep.equal(['c']);
    expect(names(await search('q=e_i'))).to.deep.equal(['c']);
  });

  it('when sorted by magnification, name or pixel size, then the server orders by that column', async () => {
    expect(names(await search('sort=magnification&dir=asc'))).to.deep.equal(['b', 'a', 'c']);
    expect(names(await search('sort=originalName&dir=asc'))).to.deep.equal(['a', 'b', 'c']);
    expect(names(await search('sort=pixelSizeUm&dir=desc'))).to.deep.equal(['b', 'a', 'c']);
  });

  it('when paged by two, then the pages are disjoint and carry the full total', async () => {
    const first = await search('pageSize=2&page=0&sort=originalName&dir=asc');
    const second = await search('pageSize=2&page=1&sort=originalName&dir=asc');
    expect(names(first)).to.deep.equal(['a', 'b']);
    expect(names(second)).to.deep.equal(['c']);
    expect(first.total).to.equal(3);
    expect(second.total).to.equal(3);
  });

  it('when a filter is malformed, then 422 naming each bad field', async () => {
    const res = await s.client.get(`/api/projects/${s.project.id}/images?modality=xray&magnificationMin=500&magnificationMax=100&sampleId=nope`);
    expectApiError(res, 422, 'validation_failed');
    expect(fieldsOf(res)).to.include.members(['query.modality.0', 'query.sampleId']);
  });

  it('when another project searches, then these images never appear', async () => {
    const stranger = await archiveScene(app.url);
    const res = await stranger.client.get(`/api/projects/${stranger.project.id}/images`);
    expect(res.body.total).to.equal(0);
  });
});
