import { ZipArchive } from 'archiver';
import type { Writable } from 'node:stream';
import { RESEARCH_CAUTION } from '../../shared/measurements/measurements';
import { AnnotationsGeoJsonService } from '../annotations/annotations-geojson.service';
import type { AppContext } from '../app-context';
import { SamplesService } from '../archive/samples.service';
import { SpecimensService } from '../archive/specimens.service';
import { MaterialsService } from '../archive/materials.service';
import { fieldsCsv } from '../measurements/measurements-csv';
import { SummaryService } from '../measurements/summary.service';
import { alignmentsOf } from './alignments-of';
import { measurementsWithContext } from './measurements-of';

type Cell = string | number | boolean | null | undefined;
const cell = (v: Cell) => {
  if (v === null || v === undefined) return '';
  let s = String(v);
  // Text a spreadsheet would run as a formula gets a leading apostrophe (names come from people).
  if (typeof v === 'string' && /^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};
const csv = (header: string[], rows: Cell[][]) => `\uFEFF${[header, ...rows].map((r) => r.map(cell).join(',')).join('\r\n')}\r\n`;

/**
 * The project's supplementary data as one ZIP: catalogue, image metadata, annotations as GeoJSON,
 * alignments of co-located images, measurements, comments and the history. The originals are not
 * included (they can be many gigabytes; each row names its SHA-256 so a reader can match the files
 * they were given).
 */
export async function writeProjectExport(ctx: AppContext, projectId: string, out: Writable): Promise<void> {
  const ds = ctx.dataSource;
  const zip = new ZipArchive({ zlib: { level: 6 } });
  const done = new Promise<void>((resolve, reject) => {
    out.on('close', resolve).on('finish', resolve);
    zip.on('error', reject);
  });
  zip.pipe(out);

  const [project] = await ds.query(`SELECT code, name, description, status, created_at FROM projects WHERE id = $1`, [projectId]);
  const members = await ds.query(`SELECT u.display_name AS name, m.role FROM project_memberships m JOIN users u ON u.id = m.user_id WHERE m.project_id = $1 ORDER BY m.role, u.display_name`, [projectId]);
  const samples = new SamplesService(ctx);
  const catalogue = {
    project,
    members,
    materials: await new MaterialsService(ctx).list(projectId),
    samples: await Promise.all((await samples.list(projectId)).map((s) => samples.detail(projectId, s.id))),
    specimens: await new SpecimensService(ctx).list(projectId),
  };
  zip.append(JSON.stringify(catalogue, null, 2), { name: 'catalogue.json' });

  const images: Record<string, unknown>[] = await ds.query(
    `SELECT i.id, i.original_name, s.code AS specimen, l.name AS location, i.modality, i.element, i.instrument, i.magnification,
            i.accelerating_voltage_kv, i.working_distance_mm, i.detector, i.acquired_at, i.pixel_size_um, i.pixel_size_source,
            i.pixel_size_confirmed, i.pixel_size_note, i.width, i.height, i.bit_depth, i.channels, i.format, i.sha256,
            array_to_string(i.tags, ';') AS tags, i.notes, u.display_name AS uploaded_by, i.uploaded_at, i.state
       FROM images i JOIN specimens s ON s.id = i.specimen_id LEFT JOIN specimen_locations l ON l.id = i.location_id
       JOIN users u ON u.id = i.uploader_id WHERE i.project_id = $1 ORDER BY i.uploaded_at`,
    [projectId],
  );
  const columns = ['id', 'original_name', 'specimen', 'location', 'modality', 'element', 'instrument', 'magnification', 'accelerating_voltage_kv', 'working_distance_mm', 'detector', 'acquired_at', 'pixel_size_um', 'pixel_size_source', 'pixel_size_confirmed', 'pixel_size_note', 'width', 'height', 'bit_depth', 'channels', 'format', 'sha256', 'tags', 'notes', 'uploaded_by', 'uploaded_at', 'state'];
  const headers = columns.map((c) => ({ pixel_size_um: 'pixel_size (µm/px)', accelerating_voltage_kv: 'accelerating_voltage (kV)', working_distance_mm: 'working_distance (mm)', width: 'width (px)', height: 'height (px)' })[c] ?? c);
  const text = (v: unknown): Cell => (v instanceof Date ? v.toISOString() : (v as Cell));
  zip.append(csv(headers, images.map((r) => columns.map((c) => text(r[c])))), { name: 'images.csv' });

  const geojson = new AnnotationsGeoJsonService(ctx);
  for (const image of images) {
    zip.append(JSON.stringify(await geojson.export(projectId, String(image['id'])), null, 1), { name: `annotations/${image['id']}.geojson` });
  }
  const names = new Map(images.map((i) => [String(i['id']), String(i['original_name'])]));
  zip.append(JSON.stringify(await alignmentsOf(ds.manager, projectId, names), null, 2), { name: 'alignments.json' });
  const measured = await measurementsWithContext(ds.manager, projectId);
  zip.append(fieldsCsv((m) => m.image.specimen.code, measured, await new SummaryService(ctx).staleTest(measured)), { name: 'measurements.csv' });

  const threads = await ds.query(
    `SELECT t.id, t.image_id, t.figure_id, t.anchor_kind, t.anchor, t.measurement_id, t.status, t.created_at, t.resolved_at,
            (SELECT json_agg(json_build_object('author', u.display_name, 'body', c.body, 'at', c.created_at) ORDER BY c.created_at)
               FROM comments c JOIN users u ON u.id = c.author_id WHERE c.thread_id = t.id) AS comments
       FROM comment_threads t WHERE t.project_id = $1 ORDER BY t.created_at`,
    [projectId],
  );
  zip.append(JSON.stringify(threads, null, 2), { name: 'comments.json' });
  const history = await ds.query(
    `SELECT e.at, u.display_name AS who, e.action, e.image_id, e.summary FROM activity_events e JOIN users u ON u.id = e.actor_id WHERE e.project_id = $1 ORDER BY e.seq`,
    [projectId],
  );
  zip.append(csv(['at', 'who', 'action', 'image_id', 'summary'], history.map((h: Record<string, Cell>) => [(h['at'] as unknown as Date).toISOString(), h['who'], h['action'], h['image_id'], h['summary']])), { name: 'history.csv' });
  zip.append(
    [
      `Supplementary data of project ${project.code}: ${project.name}`,
      `Exported ${new Date().toISOString()} from Etchfile.`,
      '',
      'catalogue.json    materials, samples (stack, route and what it implies), specimens and locations',
      'images.csv        every image with its pixel size and where that came from; sha256 identifies the original file',
      'annotations/      one GeoJSON (RFC 7946) file per image; coordinates are full-resolution image pixels, x right, y down',
      'alignments.json   how one image of a location lies on another: the matching points as clicked (full-resolution pixels',
      '                  of each image), the transform fitted from them, taking (x, y) on the other image to',
      '                  (a·x + c·y + e, b·x + d·y + f) on the image, how far each pair misses (px), who saved it and when',
      'measurements.csv  every measured field with its method, counts, units and the pixel size used; Stale = yes when the',
      '                  pixel size, or the interfaces, region outline or point count it used, changed after it was computed',
      'comments.json     review threads (on an image, or on a figure and its panels) and their comments',
      'history.csv       who did what, and when',
      '',
      RESEARCH_CAUTION,
      '',
    ].join('\n'),
    { name: 'README.txt' },
  );
  await zip.finalize();
  await done;
}
