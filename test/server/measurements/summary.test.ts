import { expect } from 'chai';
import jStat from 'jstat';
import { mountApp } from '../../support/api-client';
import { addImage, crossingsAlongRow, expectStatus, measureScene, measurementsPath, type MeasureScene } from './measurement-fixtures';

// jStat's CommonJS build exposes itself as the default export and again as `.jStat`.
const reference = (jStat as unknown as { jStat?: typeof jStat }).jStat ?? jStat;
const g112 = (meanInterceptUm: number) => -6.643856 * Math.log10(meanInterceptUm / 1000) - 3.288; // ASTM E112 lineal relation
const CAUTION = 'These numbers support research; they do not certify material for structural use.';

/** A small RFC 4180 reader: enough for the exports (quoted cells, doubled quotes, CRLF). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  for (const line of text.replace(/^\uFEFF/, '').split('\r\n')) {
    const cells: string[] = [];
    const re = /("((?:[^"]|"")*)"|[^,]*)(,|$)/g;
    let m: RegExpExecArray | null;
    while ((m = re.exec(line)) && m[0] !== '') {
      cells.push(m[2] !== undefined ? m[2].replace(/""/g, '"') : m[1]!);
      if (m[3] === '') break;
    }
    rows.push(cells);
  }
  return rows;
}

describe('measurements: statistics across fields of a specimen', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  const fiveLines = { type: 'lines', direction: 'horizontal', spacingUm: 100, count: 5 } as const;
  const rows = [350, 550, 750, 950, 1150];
  /** A field of 5 × 1000 µm of line with `perLine` crossings on each line: P = 5·perLine. */
  const field = (perLine: number) => ({ kind: 'intercept', pattern: fiveLines, marks: rows.flatMap((y, line) => crossingsAlongRow(line, y, 0, 2000, perLine)) });
  // Grid 100 µm = 200 px, centred on 2000 × 1500: x = 0, 200 … 2000 (11), y = 150 … 1350 (7) → P_T = 77 (hand-computed).
  const gridX = Array.from({ length: 11 }, (_, i) => i * 200);
  const gridY = Array.from({ length: 7 }, (_, i) => 150 + i * 200);
  const gridField = (inside: number, boundary: number) => ({
    kind: 'point_count', grid: { spacingUm: 100 }, phaseName: 'oxide',
    marks: gridY.flatMap((y) => gridX.map((x) => [x, y])).slice(0, inside + boundary).map(([x, y], i) => ({ x, y, hit: i < inside ? 'inside' : 'boundary' })),
  });

  async function fields(s: MeasureScene, perLine: number[]): Promise<string[]> {
    const ids = [s.imageId];
    for (let i = 1; i < perLine.length; i++) ids.push(await addImage(s));
    for (const [i, id] of ids.entries()) expectStatus(await s.researcher.post(measurementsPath(s, id), field(perLine[i]!)), 201);
    return ids;
  }

  it('when 5 fields give l̄ = 5000/P µm, then mean, s, 95 % CI (Student t) and %RA match jStat, and G comes from the mean l̄', async () => {
    const s = await measureScene(app.url);
    const perLine = [48, 50, 52, 49, 51];
    await fields(s, perLine);
    const res = await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements/summary`);
    expectStatus(res, 200);
    const values = perLine.map((p) => 5000 / (5 * p)); // l̄ per field, µm (hand-computed)
    const mean = reference.mean(values);
    const sd = reference.stdev(values, true);
    const ci = (reference.studentt.inv(0.975, 4) * sd) / Math.sqrt(5); // t = 2.776 for 5 fields (TRADE primer [C])
    const [row] = res.body.intercepts;
    expect(res.body.intercepts).to.have.length(1);
    expect(row).to.include({ where: 'whole image', direction: 'along', phase: null, totalCount: 1250, staleFields: 0, emptyFields: 0 });
    expect(row.meanIntercept.n).to.equal(5);
    expect(row.meanIntercept.mean).to.be.closeTo(mean, 1e-9);
    expect(row.meanIntercept.s).to.be.closeTo(sd, 1e-9);
    expect(row.meanIntercept.ci95).to.be.closeTo(ci, 1e-6);
    expect(row.meanIntercept.relativeAccuracyPct).to.be.closeTo((ci / mean) * 100, 1e-5);
    expect(row.meanIntercept.relativeAccuracyWarning).to.equal(false);
    expect(row.totalLineLengthUm).to.be.closeTo(25_000, 1e-6);
    // E112: G from the mean l̄, never the mean of the fields' G (they differ here by about 0.0013).
    expect(row.g).to.be.closeTo(g112(mean), 1e-9);
    const meanOfG = values.map(g112).reduce((a, b) => a + b, 0) / 5;
    expect(Math.abs(row.g - meanOfG)).to.be.greaterThan(1e-4);
    expect(row.warnings).to.deep.equal([]);
    expect(res.body.caution).to.equal(CAUTION);
  });

  it('when the fields scatter widely or are few, then the %RA above 10 % and the field count are flagged', async () => {
    const s = await measureScene(app.url);
    await fields(s, [20, 50, 32, 80, 18]);
    const [row] = (await s.guest.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements/summary`)).body.intercepts;
    expect(row.meanIntercept.relativeAccuracyPct).to.be.greaterThan(10);
    expect(row.meanIntercept.relativeAccuracyWarning).to.equal(true);
    expect(row.warnings.join(' ')).to.match(/above 10 %/);

    const few = await measureScene(app.url);
    await fields(few, [50, 52]);
    const [two] = (await few.guest.get(`/api/projects/${few.projectId}/specimens/${few.specimenId}/measurements/summary`)).body.intercepts;
    expect(two.meanIntercept.n).to.equal(2);
    expect(two.meanIntercept.ci95).to.be.closeTo((reference.studentt.inv(0.975, 1) * reference.stdev([20, 5000 / 260], true)) / Math.SQRT2, 1e-6);
    expect(two.warnings.join(' ')).to.contain('Only 2 fields; measure at least 5');
  });

  it('when 5 fields are point-counted, then mean P_p, its CI and %RA match jStat (E562)', async () => {
    const s = await measureScene(app.url);
    const hits = [[10, 2], [12, 0], [8, 4], [11, 1], [9, 3]] as const;
    const ids = [s.imageId, ...(await Promise.all([1, 2, 3, 4].map(() => addImage(s))))];
    for (const [i, id] of ids.entries()) {
      const res = await s.researcher.post(measurementsPath(s, id), gridField(hits[i]![0], hits[i]![1]));
      expectStatus(res, 201);
      expect(res.body.result.gridPoints).to.equal(77);
    }
    // P_p = (inside + ½·boundary) / P_T (E562 §3).
    const values = hits.map(([inside, boundary]) => (inside + boundary / 2) / 77);
    const mean = reference.mean(values);
    const ci = (reference.studentt.inv(0.975, 4) * reference.stdev(values, true)) / Math.sqrt(5);
    const [row] = (await s.reviewer.get(`/api/projects/${s.projectId}/specimens/${s.specimenId}/measurements/summary`)).body.pointCounts;
    expect(row).to.include({ phaseName: 'oxide', totalGridPoints: 385, where: 'whole image' });
    expect(row.pointFraction.mean).to.be.closeTo(mean, 1e-12);
    expect(row.pointFraction.ci95).to.be.closeTo(ci, 1e-9);
    expect(row.pointFraction.relativeAccuracyPct).to.be.closeTo((ci / mean) * 100, 1e-6);
  });

  it('when the summary and the fields are exported, then both are CSV with units in the headers and the research caution', async () => {
    const s = await measureScene(app.url);
    const ids = await fields(s, [48, 50, 52, 49, 51]);
    expectStatus(await s.researcher.post(measurementsPath(s, ids[0]!), gridField(10, 2)), 201);
    const base = `/api/projects/${s.projectId}/specimens/${s.specimenId}`;

    const summary = await s.guest.get(`${base}/measurements/summary.csv`);
    expectStatus(summary, 200);
    expect(summary.headers.get('content-type')).to.match(/^text\/csv; charset=utf-8/);
    expect(summary.headers.get('content-disposition')).to.match(/^attachment; filename="?measurement-summary-SP-/);
    const table = parseCsv(summary.body);
    expect(table[0]).to.include.members(['Mean', 'Unit', 'G (ASTM E112, from mean l̄)', 'Total line length (µm)', '%RA above 10 %']);
    const intercept = table.find((r) => r[1] === 'mean lineal intercept l̄')!;
    const head = table[0]!;
    expect(Number(intercept[head.indexOf('Fields (n)')])).to.equal(5);
    expect(intercept[head.indexOf('Unit')]).to.equal('µm');
    expect(Number(intercept[head.indexOf('Mean')])).to.be.closeTo(reference.mean([48, 50, 52, 49, 51].map((p) => 1000 / p)), 1e-3);
    expect(table.find((r) => r[1] === 'point fraction P_p of oxide')).to.not.equal(undefined);
    expect(summary.body.trimEnd().split('\r\n').pop()).to.equal(`Note: ${CAUTION}`);

    const each = await s.guest.get(`${base}/measurements.csv`);
    expectStatus(each, 200);
    expect(each.headers.get('content-type')).to.match(/^text\/csv/);
    const fieldsTable = parseCsv(each.body);
    const header = fieldsTable[0]!;
    expect(header).to.include.members(['Line length (µm)', 'P_L or N_L (mm⁻¹)', 'Mean intercept l̄ (µm)', 'Pixel size (µm/px)', 'Twins excluded', 'Count type']);
    const data = fieldsTable.slice(1).filter((r) => r.length === header.length);
    expect(data).to.have.length(6); // five intercept fields and one point count
    const first = data.find((r) => r[header.indexOf('Kind')] === 'intercept' && Number(r[header.indexOf('Count (P or N)')]) === 240)!;
    // 240 crossings over 5000 µm: P_L = 48 mm⁻¹, l̄ = 20.833 µm (hand-computed).
    expect(Number(first[header.indexOf('P_L or N_L (mm⁻¹)')])).to.equal(48);
    expect(Number(first[header.indexOf('Mean intercept l̄ (µm)')])).to.be.closeTo(20.833, 1e-3);
    expect(first[header.indexOf('Twins excluded')]).to.equal('yes');
    expect(each.body).to.contain(CAUTION);
  });

  it('when the specimen is not in the project, then 404', async () => {
    const s = await measureScene(app.url);
    const other = await measureScene(app.url);
    const res = await s.guest.get(`/api/projects/${s.projectId}/specimens/${other.specimenId}/measurements/summary`);
    expectStatus(res, 404);
  });
});
