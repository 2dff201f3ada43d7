import { expect } from 'chai';
import sharp from 'sharp';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import type { SuggestedCrossings } from '../../../shared/measurements/measurement-records';
import { mountApp } from '../../support/api-client';
import { runningServer } from '../../support/test-server';
import { etchedMicrograph, labelChangesAlongRow, orientationMap, seededRandom, voronoiLabels } from '../../support/synthetic-micrograph';
import { archiveScene, fieldsFor, upload, type ArchiveScene } from '../images/image-fixtures';
import { expectStatus, measurementState } from './measurement-fixtures';

const W = 900;
const H = 600;
const UM_PER_PX = 0.5;

/**
 * Eleven horizontal lines 55 px (27.5 µm) apart, centred: y = 25, 80 … 575, moved down half a pixel so each
 * runs through the centres of pixel row 25 + 55·k, the rows whose label changes are the truth (hand-computed).
 */
const ROW_PATTERN = { pattern: { type: 'lines', direction: 'horizontal', spacingUm: 55 * UM_PER_PX, count: 11 }, placement: { offsetPx: [0, 0.5] } } as const;
const ROWS = Array.from({ length: 11 }, (_, k) => 25 + k * 55);

/** A Voronoi tessellation like voronoiLabels, with seeds bucketed on a grid so large images stay quick to make. */
function bucketedVoronoi(width: number, height: number, grains: number, seed: number): Int32Array {
  const rnd = seededRandom(seed);
  const seeds = Array.from({ length: grains }, () => [rnd() * width, rnd() * height] as const);
  const cell = Math.sqrt((width * height) / grains) * 2;
  const cols = Math.ceil(width / cell);
  const buckets = new Map<number, number[]>();
  seeds.forEach(([x, y], g) => {
    const key = Math.floor(y / cell) * cols + Math.floor(x / cell);
    buckets.set(key, [...(buckets.get(key) ?? []), g]);
  });
  const labels = new Int32Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      let [best, bestD] = [0, Infinity];
      const [cx, cy] = [Math.floor(x / cell), Math.floor(y / cell)];
      for (let r = 1; best === 0 && bestD === Infinity; r++) {
        for (let j = cy - r; j <= cy + r; j++) for (let i = cx - r; i <= cx + r; i++) {
          for (const g of (i >= 0 && i < cols ? buckets.get(j * cols + i) : undefined) ?? []) {
            const d = (seeds[g]![0] - x) ** 2 + (seeds[g]![1] - y) ** 2;
            if (d < bestD) [best, bestD] = [g, d];
          }
        }
      }
      labels[y * width + x] = best;
    }
  }
  return labels;
}

describe('measurements: suggested crossings from the original pixels, through the real upload route', function () {
  this.timeout(120_000);
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  // A seeded random tessellation (common practice for testing grain-size software, no source); the truth is the
  // count of label changes along the same rows of the label image, as in test/shared/measurements/crossings.test.ts.
  const labels = voronoiLabels(W, H, 260, 7);
  const truthUm = ((ROWS.length * W) / ROWS.reduce((a, y) => a + labelChangesAlongRow(labels, W, y), 0)) * UM_PER_PX;

  async function uploaded(s: ArchiveScene, bytes: Buffer, name: string, modality: string): Promise<string> {
    const res = await upload(s.client, s.project.id, bytes, name, fieldsFor(s, { modality, pixelSizeUm: String(UM_PER_PX) }));
    expectStatus(res, 201);
    return res.body.image.id as string;
  }

  /** Suggests, checks nothing was stored, then saves the suggestions as confirmed marks and returns the server's l̄. */
  async function suggestAndConfirm(s: ArchiveScene, imageId: string, extra: Record<string, unknown> = {}): Promise<{ suggestion: SuggestedCrossings; meanInterceptUm: number }> {
    const path = `/api/projects/${s.project.id}/images/${imageId}/measurements`;
    const before = await measurementState(imageId);
    const res = await s.client.post(`${path}/suggest`, { ...ROW_PATTERN, ...extra });
    expectStatus(res, 200);
    expect(await measurementState(imageId)).to.deep.equal(before); // a suggestion stores nothing
    const suggestion = res.body as SuggestedCrossings;
    const marks = suggestion.marks.map((m) => ({ ...m, status: 'confirmed' }));
    const saved = await s.client.post(path, { kind: 'intercept', ...ROW_PATTERN, marks });
    expectStatus(saved, 201);
    return { suggestion, meanInterceptUm: saved.body.result.meanInterceptUm };
  }

  it('when an etched light micrograph is uploaded, then the dark-valley suggestions, confirmed, give l̄ within 5 % of the label image’s truth', async () => {
    const s = await archiveScene(app.url);
    const imageId = await uploaded(s, await etchedMicrograph(labels, W, H, 7), 'etched.png', 'lom_bright_field');
    const { suggestion, meanInterceptUm } = await suggestAndConfirm(s, imageId);
    expect(suggestion.detector).to.equal('valleys'); // default for light optical images
    expect(suggestion.perLine).to.have.length(11);
    expect(suggestion.perLine.every((l) => l.samples === W + 1)).to.equal(true); // one sample per pixel of line, both ends
    expect(suggestion.marks.every((m) => m.status === 'suggested' && m.kind === 'crossing' && ROWS.includes(m.y - 0.5))).to.equal(true);
    expect(suggestion.ms).to.be.greaterThan(0);
    expect(meanInterceptUm).to.be.closeTo(truthUm, truthUm * 0.05);
  });

  it('when an orientation map is uploaded, then the colour-step suggestions (its default) give l̄ within 5 % of the truth', async () => {
    const s = await archiveScene(app.url);
    const imageId = await uploaded(s, await orientationMap(labels, W, H, 7), 'orientation.png', 'ebsd_orientation');
    const { suggestion, meanInterceptUm } = await suggestAndConfirm(s, imageId);
    expect(suggestion.detector).to.equal('steps');
    expect(meanInterceptUm).to.be.closeTo(truthUm, truthUm * 0.05);
  });

  it('when the same micrograph comes as a 16-bit TIFF, then its samples are scaled to 8 bits and the suggestions are the same', async () => {
    const s = await archiveScene(app.url);
    const png = await etchedMicrograph(labels, W, H, 7);
    const grey = await sharp(png).extractChannel(0).raw().toBuffer();
    const sixteen = await sharp(Uint16Array.from(grey, (v) => v * 257), { raw: { width: W, height: H, channels: 1 } }).toColourspace('grey16').tiff({ compression: 'lzw' }).toBuffer();
    const eight = await suggestAndConfirm(s, await uploaded(s, png, 'etched-8.png', 'lom_bright_field'));
    const deep = await suggestAndConfirm(s, await uploaded(s, sixteen, 'etched-16.tif', 'lom_bright_field'));
    expect(deep.suggestion.marks).to.deep.equal(eight.suggestion.marks); // v·257 / 257 = v exactly
  });

  it('when a band is chosen, then only crossings inside it are suggested', async () => {
    const s = await archiveScene(app.url);
    const imageId = await uploaded(s, await etchedMicrograph(labels, W, H, 7), 'banded.png', 'lom_bright_field');
    await addDefaultAnnotationClasses(runningServer().ctx.dataSource.manager, s.project.id);
    const classes = (await s.client.get(`/api/projects/${s.project.id}/annotation-classes`)).body as { id: string; name: string }[];
    const bond = classes.find((c) => c.name === 'Bond interface')!.id;
    expectStatus(await s.client.post(`/api/projects/${s.project.id}/images/${imageId}/annotations`, { classId: bond, kind: 'polyline', points: [[0, 300], [900, 300]] }), 201);
    const res = await s.client.post(`/api/projects/${s.project.id}/images/${imageId}/measurements/suggest`, { ...ROW_PATTERN, where: { type: 'band', band: 1 } });
    expectStatus(res, 200);
    expect(res.body.marks.length).to.be.greaterThan(0);
    expect(res.body.marks.every((m: { y: number }) => m.y < 300)).to.equal(true);
    expect(res.body.perLine.filter((l: { samples: number }) => l.samples > 0)).to.have.length(5); // rows 25.5 … 245.5 lie above y = 300 (hand-computed)
  });

  it('when an outlined region is chosen and the other finder named, then the suggestions lie inside the outline and say which finder made them', async () => {
    const s = await archiveScene(app.url);
    const imageId = await uploaded(s, await etchedMicrograph(labels, W, H, 8), 'zoned.png', 'lom_bright_field');
    await addDefaultAnnotationClasses(runningServer().ctx.dataSource.manager, s.project.id);
    const classes = (await s.client.get(`/api/projects/${s.project.id}/annotation-classes`)).body as { id: string; name: string }[];
    const zone = classes.find((c) => c.name === 'Deformation zone')!.id;
    const outline = await s.client.post(`/api/projects/${s.project.id}/images/${imageId}/annotations`, { classId: zone, kind: 'polygon', points: [[200, 100], [700, 100], [700, 500], [200, 500]] });
    expectStatus(outline, 201);
    const res = await s.client.post(`/api/projects/${s.project.id}/images/${imageId}/measurements/suggest`, {
      ...ROW_PATTERN, where: { type: 'region', annotationId: outline.body.id }, detector: 'steps',
    });
    expectStatus(res, 200);
    expect(res.body.detector, 'the named finder, not the light-micrograph default').to.equal('steps');
    expect(res.body.marks.length).to.be.greaterThan(0);
    for (const m of res.body.marks as { x: number; y: number }[]) {
      expect(m.x).to.be.within(200, 700);
      expect(m.y).to.be.within(100, 500);
    }
    // Rows 135.5 … 465.5 cross the outline: 7 of the 11 (hand-computed from y = 25.5 + 55k).
    expect(res.body.perLine.filter((l: { samples: number }) => l.samples > 0)).to.have.length(7);
  });

  it('when a typical 2048 × 1536 field is searched along 10 + 10 lines, then the answer comes within 10 s and reports its time', async () => {
    const s = await archiveScene(app.url);
    const [w, h] = [2048, 1536];
    const big = bucketedVoronoi(w, h, 1500, 11);
    const imageId = await uploaded(s, await etchedMicrograph(big, w, h, 11), 'typical.png', 'lom_bright_field');
    const res = await s.client.post(`/api/projects/${s.project.id}/images/${imageId}/measurements/suggest`, { pattern: { type: 'lines', direction: 'both', spacingUm: 70, count: 10 } });
    expectStatus(res, 200);
    expect(res.body.perLine).to.have.length(20);
    expect(res.body.marks.length).to.be.greaterThan(200);
    expect(res.body.ms).to.be.greaterThan(0).and.lessThan(10_000);
  });
});
