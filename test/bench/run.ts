import { spawn } from 'node:child_process';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { pino } from 'pino';
import sharp from 'sharp';
import { Material } from '../../server/archive/material.entity';
import { SampleLayer } from '../../server/archive/sample-layer.entity';
import { Sample } from '../../server/archive/sample.entity';
import { Specimen } from '../../server/archive/specimen.entity';
import { hashPassword } from '../../server/auth/password-hash';
import { User } from '../../server/auth/user.entity';
import { loadConfig, PROJECT_ROOT } from '../../server/config';
import { startServer } from '../../server/main';
import { prepareDatabase } from '../../server/ops/prepare-database';
import { ProjectMembership } from '../../server/projects/project-membership.entity';
import { Project } from '../../server/projects/project.entity';
import { totalTileCount } from '../../shared/tile-pyramid';
import { ApiClient } from '../support/api-client';

/**
 * `npm run bench`: for a 10000 × 10000 px 8-bit TIFF, the time from "upload accepted" (201) to
 * "pyramid ready" and the peak memory of the process doing it, beside Debian's `vips dzsave` making
 * the same 256 px Deep Zoom pyramid from the same file. Runs alternate, so drift hits both alike;
 * medians and their ratio are reported (timings on these machines drift 2-3× within an hour).
 */
const RUNS = Number(process.env['EF_BENCH_RUNS'] ?? 3);
const SIZE = 10_000;
const PASSWORD = 'bench-password-long';

const config = loadConfig({
  ...process.env,
  EF_MODE: 'local',
  EF_DB_NAME: process.env['EF_BENCH_DB_NAME'] ?? 'etchfile_bench',
  EF_PORT: process.env['EF_BENCH_PORT'] ?? '8291',
  // No mail is sent here, so no fake SMTP server (and no port to collide on).
  EF_FAKE_SMTP: 'false',
  EF_STORAGE_DIR: path.join(PROJECT_ROOT, 'storage', 'etchfile_bench'),
  EF_LOG_LEVEL: 'warn',
});
const logger = pino({ level: 'warn' });
await rm(config.storageDir, { recursive: true, force: true });
const cluster = await prepareDatabase(config, logger, { fresh: true, demo: false });
const running = await startServer(config, logger);
const scratch = await mkdtemp(path.join(os.tmpdir(), 'etchfile-bench-'));

try {
  const file = path.join(scratch, 'field-10000.tif');
  console.log(`etchfile bench: making a ${SIZE} × ${SIZE} px 8-bit grey TIFF…`);
  // Smooth structure plus noise, so JPEG tiles cost what a real micrograph's would.
  await sharp({ create: { width: SIZE, height: SIZE, channels: 3, background: 128, noise: { type: 'gaussian', mean: 128, sigma: 24 } } })
    .blur(1.2)
    .toColourspace('b-w')
    .tiff({ compression: 'lzw' })
    .toFile(file);
  const bytes = await readFile(file);
  const { client, projectId, specimenId } = await benchScene(`http://${config.host}:${config.port}`);
  const tiles = totalTileCount(SIZE, SIZE);

  const ours: { seconds: number; peakMb: number }[] = [];
  const vips: { seconds: number; peakMb: number }[] = [];
  for (let run = 1; run <= RUNS; run++) {
    ours.push(await ingestOnce(client, projectId, specimenId, bytes));
    vips.push(await dzsaveOnce(file, path.join(scratch, `dz-${run}`)));
    console.log(`  run ${run}: Etchfile ${ours.at(-1)!.seconds.toFixed(2)} s, ${ours.at(-1)!.peakMb} MB peak | vips dzsave ${vips.at(-1)!.seconds.toFixed(2)} s, ${vips.at(-1)!.peakMb} MB peak`);
  }
  const med = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const oursS = med(ours.map((r) => r.seconds));
  const vipsS = med(vips.map((r) => r.seconds));
  console.log(`\n${SIZE} × ${SIZE} px 8-bit TIFF, ${tiles} tiles of 256 px, median of ${RUNS} alternating runs:`);
  console.log(`  Etchfile, upload accepted → pyramid ready (thumbnail, preview, tiles, stored, row updated): ${oursS.toFixed(2)} s, peak RSS ${med(ours.map((r) => r.peakMb))} MB`);
  console.log(`  vips dzsave (Debian libvips-tools), same pyramid from the same file:                     ${vipsS.toFixed(2)} s, peak RSS ${med(vips.map((r) => r.peakMb))} MB`);
  console.log(`  ratio Etchfile / vips dzsave: ${(oursS / vipsS).toFixed(2)}×`);
} finally {
  await rm(scratch, { recursive: true, force: true });
  await running.stop();
  if (cluster.startedHere) cluster.stop();
}

async function benchScene(baseUrl: string) {
  const ds = running.ctx.dataSource;
  const user = await ds.getRepository(User).save({ email: 'bench@lab.etchfile.test', displayName: 'Bench', siteRole: 'member', passwordHash: await hashPassword(PASSWORD) });
  const project = await ds.getRepository(Project).save({ code: 'BENCH', name: 'Benchmark', description: '' });
  await ds.getRepository(ProjectMembership).insert({ projectId: project.id, userId: user.id, role: 'lead' });
  const material = await ds.getRepository(Material).save({ projectId: project.id, designation: 'B-1', composition: { wtPct: {}, balance: null } });
  const sample = await ds.getRepository(Sample).save({ projectId: project.id, code: 'B', name: 'Bench sample' });
  await ds.getRepository(SampleLayer).insert({ sampleId: sample.id, position: 0, materialId: material.id, thicknessMm: 1 });
  const specimen = await ds.getRepository(Specimen).save({ projectId: project.id, sampleId: sample.id, code: 'B1', sectionPlane: 'longitudinal', preparation: { steps: [], etchant: '', etchingTimeS: null } });
  const client = new ApiClient(baseUrl);
  await client.signIn(user.email, PASSWORD);
  return { client, projectId: project.id, specimenId: specimen.id };
}

/** Uploads, times 201 → ready, samples this process's RSS (the worker runs here), then deletes the image for the next run. */
async function ingestOnce(client: ApiClient, projectId: string, specimenId: string, bytes: Buffer): Promise<{ seconds: number; peakMb: number }> {
  const form = new FormData();
  form.append('specimenId', specimenId);
  form.append('modality', 'lom_bright_field');
  form.append('file', new Blob([new Uint8Array(bytes)]), 'field-10000.tif');
  const res = await fetch(`${client.baseUrl}/api/projects/${projectId}/images`, { method: 'POST', body: form, headers: await client.authHeaders() });
  const body = (await res.json()) as { image: { id: string } };
  if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${JSON.stringify(body)}`);
  const accepted = performance.now();
  let peak = process.memoryUsage().rss;
  const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 20);
  try {
    for (;;) {
      const [row] = await running.ctx.dataSource.query('SELECT state, failure_reason FROM images WHERE id = $1', [body.image.id]);
      if (row.state === 'ready') break;
      if (row.state === 'failed') throw new Error(`processing failed: ${row.failure_reason}`);
      await new Promise((r) => setTimeout(r, 20));
    }
  } finally {
    clearInterval(sampler);
  }
  const seconds = (performance.now() - accepted) / 1000;
  await client.delete(`/api/projects/${projectId}/images/${body.image.id}`);
  return { seconds, peakMb: Math.round(peak / 1e6) };
}

/** `vips dzsave` as a child process; its peak RSS is read from /proc (VmHWM) while it runs. */
function dzsaveOnce(file: string, out: string): Promise<{ seconds: number; peakMb: number }> {
  return new Promise((resolve, reject) => {
    const started = performance.now();
    const child = spawn('vips', ['dzsave', file, out, '--tile-size', '256', '--overlap', '0', '--suffix', '.jpg[Q=85]'], { stdio: 'inherit' });
    let peakKb = 0;
    const sampler = setInterval(() => {
      readFile(`/proc/${child.pid}/status`, 'utf8')
        .then((s) => (peakKb = Math.max(peakKb, Number(/VmHWM:\s+(\d+)/.exec(s)?.[1] ?? 0))))
        .catch(() => {});
    }, 20);
    child.on('error', reject);
    child.on('exit', (code) => {
      clearInterval(sampler);
      if (code !== 0) return reject(new Error(`vips dzsave exited with ${code}`));
      resolve({ seconds: (performance.now() - started) / 1000, peakMb: Math.round((peakKb * 1024) / 1e6) });
    });
  });
}
