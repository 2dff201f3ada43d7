import { performance } from 'node:perf_hooks';
import type { Readable } from 'node:stream';
import { defaultDetector, findSteps, findValleys } from '../../shared/measurements/crossings';
import type { SuggestedCrossings, TestPath } from '../../shared/measurements/measurement-records';
import type { InterceptMark, SuggestBody } from '../../shared/measurements/measurements';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import type { Image } from '../images/image.entity';
import { chainLength, countedPaths, layPattern } from './field-geometry';
import { invalid, pixelSizeOf, readFrame } from './measurement-build';
import { MeasurementsService } from './measurements.service';
import { boxAround, pointAlong, readWindow, sampleChain, type PixelWindow } from './pixel-profiles';

/** Above this many samples the union of the lines is not decoded at once; each piece reads its own strip instead. */
const WINDOW_SAMPLE_LIMIT = 48_000_000;

/** Pieces shorter than this (px) carry too few samples for the detectors' noise estimate. */
const SHORTEST_PIECE_PX = 8;

/** Suggested crossings along a pattern, from the original's pixels. Nothing is stored: a person confirms what they keep. */
export class SuggestService {
  private readonly measurements: MeasurementsService;

  constructor(private readonly ctx: AppContext) {
    this.measurements = new MeasurementsService(ctx);
  }

  async suggest(projectId: string, imageId: string, body: SuggestBody): Promise<SuggestedCrossings> {
    const started = performance.now();
    const m = this.ctx.dataSource.manager;
    const image = await this.measurements.image(m, projectId, imageId);
    const umPerPx = pixelSizeOf(image);
    const detector = body.detector ?? defaultDetector(image.modality);
    if (!detector) throw invalid([{ field: 'body.detector', message: `There is no default detector for ${image.modality.replace(/_/g, ' ')} images; choose valleys (dark boundaries) or steps (grains of flat tone).` }]);
    const frame = await readFrame(m, image, body.where);
    const testLines = countedPaths(layPattern(body.pattern, body.placement.offsetPx, image.width, image.height, umPerPx), { ...frame, where: body.where, umPerPx });
    if (!(testLines.reduce((sum, p) => sum + p.lengthPx, 0) > 0)) throw invalid([{ field: 'body.pattern', message: 'The pattern misses the chosen place: no test line lies in it. Move or resize the pattern.' }]);

    const mode = detector === 'valleys' || image.channels <= 2 ? 'grey' : 'colour';
    const input = await this.original(image);
    const readStart = performance.now();
    const chains = testLines.flatMap((p) => p.pieces.filter((c) => chainLength(c) >= SHORTEST_PIECE_PX));
    const union = boxAround(chains, image);
    const shared = union.width * union.height * (mode === 'grey' ? 1 : 3) <= WINDOW_SAMPLE_LIMIT ? await readWindow(input, image, union, mode, this.maxPixels) : null;
    let readMs = performance.now() - readStart;

    const marks: InterceptMark[] = [];
    const perLine: SuggestedCrossings['perLine'] = [];
    for (const path of testLines) {
      let [count, samples] = [0, 0];
      for (const chain of path.pieces) {
        if (chainLength(chain) < SHORTEST_PIECE_PX) continue;
        let win: PixelWindow | null = shared;
        if (!win) {
          const t = performance.now();
          win = await readWindow(input, image, boxAround([chain], image), mode, this.maxPixels);
          readMs += performance.now() - t;
        }
        const profile = sampleChain(win, chain);
        samples += profile[0]!.length;
        const found = detector === 'valleys' ? findValleys(profile[0]!) : findSteps(profile);
        for (const s of found) {
          const [x, y] = pointAlong(chain, s);
          marks.push({ x, y, line: path.line, kind: 'crossing', status: 'suggested' });
        }
        count += found.length;
      }
      perLine.push({ line: path.line, count, samples });
    }
    const ms = performance.now() - started;
    this.ctx.logger.info({ imageId, detector, lines: testLines.length, samples: perLine.reduce((a, l) => a + l.samples, 0), marks: marks.length, readMs: Math.round(readMs), ms: Math.round(ms) }, 'suggested crossings');
    return { detector, marks, perLine, testLines: testLines as TestPath[], ms: Math.round(ms * 10) / 10 };
  }

  private get maxPixels(): number {
    return this.ctx.config.images.maxPixels;
  }

  /** The original as a path on disk when the store has one, else its bytes (an S3 bucket). */
  private async original(image: Image): Promise<string | Buffer> {
    // A row whose original is gone is a broken store, not a bad request: say so plainly.
    const missing = () => new AppError(409, 'image_not_ready', 'The original file of this image is missing from the store, so its pixels cannot be read.');
    if (!(await this.ctx.files.stat(image.originalKey))) throw missing();
    const onDisk = this.ctx.files.pathOnDisk?.(image.originalKey);
    if (onDisk) return onDisk;
    const stream: Readable | null = await this.ctx.files.get(image.originalKey);
    if (!stream) throw missing();
    const chunks: Buffer[] = [];
    for await (const c of stream) chunks.push(c as Buffer);
    return Buffer.concat(chunks);
  }
}
