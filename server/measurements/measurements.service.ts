import type { EntityManager } from 'typeorm';
import type { FieldProblem } from '../../shared/api-error';
import type { Measurement as MeasurementDto, MeasurementDetail, MeasurementHistoryEntry } from '../../shared/measurements/measurement-records';
import { measurementBody, type MeasurementBody, type UpdateMeasurementBody } from '../../shared/measurements/measurements';
import { recordActivity } from '../activity/record-activity';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { returnToDraftIfCleared } from '../reviews/return-to-draft';
import { checkMarks, compute, invalid, layOut, pixelSizeOf, readFrame, type Computed, type FrameSnapshot } from './measurement-build';
import { MeasurementHistory } from './measurement-history.entity';
import { describeResult, formatUmPerPx, KIND_WORDS, staleness, toHistoryEntry, toMeasurementDto } from './measurement.mapper';
import { Measurement, type MeasurementLayout } from './measurement.entity';

/**
 * Measurements on an image. Every save recomputes the result on the server; every change bumps
 * `version` (a writer holding an older one gets 409) and appends the replaced result to the history.
 */
export class MeasurementsService {
  constructor(private readonly ctx: AppContext) {}

  async list(projectId: string, imageId: string): Promise<MeasurementDto[]> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId);
    const rows = await m.find(Measurement, { where: { imageId }, relations: { author: true, image: true }, order: { createdAt: 'ASC' } });
    return rows.map(toMeasurementDto);
  }

  async detail(projectId: string, imageId: string, id: string): Promise<MeasurementDetail> {
    const m = this.ctx.dataSource.manager;
    await this.image(m, projectId, imageId);
    const current = await this.find(m, imageId, id);
    const history = await m.find(MeasurementHistory, { where: { measurementId: id }, relations: { replacer: true }, order: { seq: 'DESC' } });
    return { ...toMeasurementDto(current), history: history.map(toHistoryEntry) };
  }

  async create(user: Express.User, projectId: string, imageId: string, body: MeasurementBody): Promise<MeasurementDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const umPerPx = pixelSizeOf(image);
      const layout = layOut(body, await readFrame(m, image, body.where), umPerPx);
      const computed = compute(body, layout, umPerPx);
      checkMarks(body, layout, computed, umPerPx);
      const saved = await m.save(
        m.create(Measurement, {
          projectId, imageId, kind: body.kind, definition: body, layout: withCounted(layout, computed), result: computed.result,
          whereLabel: computed.whereLabel, umPerPx, pixelSizeSource: image.pixelSizeSource, authorId: user.id, updatedBy: user.id,
        }),
      );
      const summary = `measured ${KIND_WORDS[body.kind]} on ${computed.whereLabel}: ${describeResult(computed.result)}`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.created', summary, details: { measurementId: saved.id } });
      // A cleared image is no longer what was cleared: back to draft, in this transaction.
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
      return this.reload(m, saved.id);
    });
  }

  /** Merges the changes into the stored definition and recomputes at the measurement's own pixel size (recompute adopts a new one). */
  async update(user: Express.User, projectId: string, imageId: string, id: string, body: UpdateMeasurementBody): Promise<MeasurementDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, id);
      if (current.version !== body.version) await this.conflict(m, current, body.version);
      const { version, ...changes } = body;
      const def = parseMerged(current.definition, changes);
      const { laid, gridSpacingPx, counted, ...kept } = current.layout;
      // A new where reads the annotations again (interfaces may have been redrawn); otherwise the stored frame stands.
      const frame: FrameSnapshot = 'where' in changes ? await readFrame(m, image, def.where) : kept;
      const relay = 'pattern' in changes || 'placement' in changes || 'grid' in changes;
      const layout: MeasurementLayout = relay ? layOut(def, frame, current.umPerPx) : { ...frame, laid, gridSpacingPx, counted };
      const computed = compute(def, layout, current.umPerPx);
      checkMarks(def, layout, computed, current.umPerPx);
      await this.replace(m, user, current, version, 'edited', {
        definition: def, layout: withCounted(layout, computed), result: computed.result, whereLabel: computed.whereLabel,
      });
      const summary = `changed a measurement of ${KIND_WORDS[def.kind]} on ${computed.whereLabel}: ${describeResult(computed.result)}`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.updated', summary, details: { measurementId: id, version: version + 1 } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
      return this.reload(m, id);
    });
  }

  /** A new result at the image's current pixel size, from the same layout and marks; the old one goes to the history. */
  async recompute(user: Express.User, projectId: string, imageId: string, id: string, version: number): Promise<MeasurementDto> {
    return this.ctx.dataSource.transaction(async (m) => {
      const image = await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, id);
      if (current.version !== version) await this.conflict(m, current, version);
      const umPerPx = pixelSizeOf(image);
      // Nothing changed since it was computed: answer it as it is, without a history row.
      if (staleness(current.umPerPx, image.pixelSizeUm) === null) return this.reload(m, id);
      const computed = compute(current.definition, current.layout, umPerPx);
      await this.replace(m, user, current, version, 'recomputed', {
        layout: withCounted(current.layout, computed), result: computed.result, whereLabel: computed.whereLabel,
        umPerPx, pixelSizeSource: image.pixelSizeSource, computedAt: new Date(),
      });
      const summary = `recomputed a measurement at ${formatUmPerPx(umPerPx)} µm/px (was ${formatUmPerPx(current.umPerPx)}): ${describeResult(computed.result)}`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.updated', summary, details: { measurementId: id, version: version + 1 } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
      return this.reload(m, id);
    });
  }

  async remove(user: Express.User, projectId: string, imageId: string, id: string, version: number): Promise<void> {
    await this.ctx.dataSource.transaction(async (m) => {
      await this.image(m, projectId, imageId);
      const current = await this.find(m, imageId, id);
      if (current.version !== version) await this.conflict(m, current, version);
      await m.insert(MeasurementHistory, historyRow(current, user, 'deleted'));
      const result = await m.delete(Measurement, { id, version });
      if (result.affected !== 1) await this.conflict(m, current, version);
      const summary = `deleted a measurement of ${KIND_WORDS[current.kind]} on ${current.whereLabel} (${describeResult(current.result)})`;
      await recordActivity(m, { projectId, imageId, actorId: user.id, action: 'measurement.deleted', summary, details: { measurementId: id } });
      await returnToDraftIfCleared(m, imageId, user.id, 'the measurements');
    });
  }

  /** The image in this project, or 404. */
  async image(m: EntityManager, projectId: string, imageId: string): Promise<Image> {
    const image = await m.findOneBy(Image, { id: imageId, projectId });
    if (!image) throw AppError.notFound('The image');
    return image;
  }

  private async replace(m: EntityManager, user: Express.User, current: Measurement, version: number, reason: MeasurementHistoryEntry['reason'], changes: Partial<Measurement>): Promise<void> {
    await m.insert(MeasurementHistory, historyRow(current, user, reason));
    const result = await m
      .createQueryBuilder()
      .update(Measurement)
      .set({ ...changes, computedAt: new Date(), updatedAt: new Date(), updatedBy: user.id, version: () => 'version + 1' })
      .where('id = :id AND version = :version', { id: current.id, version })
      .execute();
    // Someone saved between our read and this write: the transaction rolls back with the history row.
    if (result.affected !== 1) await this.conflict(m, current, version);
  }

  private async find(m: EntityManager, imageId: string, id: string): Promise<Measurement> {
    const row = await m.findOne(Measurement, { where: { id, imageId }, relations: { author: true, image: true } });
    if (!row) throw AppError.notFound('The measurement');
    return row;
  }

  private async reload(m: EntityManager, id: string): Promise<MeasurementDto> {
    return toMeasurementDto(await m.findOneOrFail(Measurement, { where: { id }, relations: { author: true, image: true } }));
  }

  private async conflict(m: EntityManager, before: Measurement, sentVersion: number): Promise<never> {
    const now = await m.findOne(Measurement, { where: { id: before.id }, relations: { author: true } });
    const [who] = now ? await m.query('SELECT display_name FROM users WHERE id = $1', [now.updatedBy]) : [];
    throw AppError.conflict(
      now
        ? `${who?.display_name ?? 'Someone'} changed this measurement after you loaded it (you had version ${sentVersion}, it is now ${now.version}). Reload it, then make your change again.`
        : 'Someone deleted this measurement after you loaded it.',
    );
  }
}

function withCounted(layout: MeasurementLayout, computed: Computed): MeasurementLayout {
  return { ...layout, counted: { testLines: computed.testLines, grid: computed.grid } };
}

function historyRow(current: Measurement, user: Express.User, reason: MeasurementHistoryEntry['reason']): Partial<MeasurementHistory> {
  return {
    measurementId: current.id, projectId: current.projectId, imageId: current.imageId, version: current.version, reason,
    definition: current.definition, result: current.result, umPerPx: current.umPerPx, pixelSizeSource: current.pixelSizeSource, replacedBy: user.id,
  };
}

/** The stored definition with the changes laid over it, checked as a whole like a new one (so every rule still holds). */
function parseMerged(stored: MeasurementBody, changes: Omit<UpdateMeasurementBody, 'version'>): MeasurementBody {
  const parsed = measurementBody.safeParse({ ...stored, ...changes });
  if (parsed.success) return parsed.data;
  const details: FieldProblem[] = parsed.error.issues.map((issue) =>
    issue.code === 'unrecognized_keys'
      ? { field: ['body', ...issue.path.map(String), issue.keys[0]!].join('.'), message: `This ${stored.kind.replace('_', ' ')} measurement has no field ${issue.keys.join(', ')}.` }
      : { field: ['body', ...issue.path.map(String)].join('.'), message: issue.message },
  );
  throw invalid(details);
}
