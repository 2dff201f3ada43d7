import type { Request, RequestHandler, Response } from 'express';
import type { MeasurementBody, SuggestBody, UpdateMeasurementBody } from '../../shared/measurements/measurements';
import type { AppContext } from '../app-context';
import { currentUser } from '../http/require-auth';
import { fieldsCsv, summaryCsv } from './measurements-csv';
import { MeasurementsService } from './measurements.service';
import { SuggestService } from './suggest.service';
import { SummaryService } from './summary.service';

const p = (req: Request, name: string) => String(req.params[name]);

/** HTTP in, service call, HTTP out for measurements, suggestions and specimen summaries. */
export class MeasurementsController {
  private readonly measurements: MeasurementsService;
  private readonly suggestions: SuggestService;
  private readonly summaries: SummaryService;

  constructor(ctx: AppContext) {
    this.measurements = new MeasurementsService(ctx);
    this.suggestions = new SuggestService(ctx);
    this.summaries = new SummaryService(ctx);
  }

  list: RequestHandler = async (req, res) => {
    res.json(await this.measurements.list(p(req, 'projectId'), p(req, 'imageId')));
  };
  detail: RequestHandler = async (req, res) => {
    res.json(await this.measurements.detail(p(req, 'projectId'), p(req, 'imageId'), p(req, 'measurementId')));
  };
  create: RequestHandler = async (req, res) => {
    res.status(201).json(await this.measurements.create(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), req.body as MeasurementBody));
  };
  update: RequestHandler = async (req, res) => {
    const [projectId, imageId, id] = [p(req, 'projectId'), p(req, 'imageId'), p(req, 'measurementId')];
    res.json(await this.measurements.update(currentUser(req), projectId, imageId, id, req.body as UpdateMeasurementBody));
  };
  recompute: RequestHandler = async (req, res) => {
    const [projectId, imageId, id] = [p(req, 'projectId'), p(req, 'imageId'), p(req, 'measurementId')];
    res.json(await this.measurements.recompute(currentUser(req), projectId, imageId, id, (req.body as { version: number }).version));
  };
  remove: RequestHandler = async (req, res) => {
    const { version } = req.query as unknown as { version: number };
    await this.measurements.remove(currentUser(req), p(req, 'projectId'), p(req, 'imageId'), p(req, 'measurementId'), version);
    res.status(204).end();
  };
  suggest: RequestHandler = async (req, res) => {
    res.json(await this.suggestions.suggest(p(req, 'projectId'), p(req, 'imageId'), req.body as SuggestBody));
  };

  summary: RequestHandler = async (req, res) => {
    res.json(await this.summaries.summary(p(req, 'projectId'), p(req, 'specimenId')));
  };
  summaryCsv: RequestHandler = async (req, res) => {
    const summary = await this.summaries.summary(p(req, 'projectId'), p(req, 'specimenId'));
    sendCsv(res, `measurement-summary-${summary.specimenCode}.csv`, summaryCsv(summary));
  };
  fieldsCsv: RequestHandler = async (req, res) => {
    const { specimen, rows } = await this.summaries.fields(p(req, 'projectId'), p(req, 'specimenId'));
    sendCsv(res, `measurements-${specimen.code}.csv`, fieldsCsv(specimen.code, rows, await this.summaries.staleTest(rows)));
  };
}

function sendCsv(res: Response, fileName: string, body: string): void {
  res.type('text/csv; charset=utf-8').attachment(fileName).send(body);
}
