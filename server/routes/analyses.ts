// Analyses: the failed-jobs list, one analysis (polled for progress), retry, and its series.
import { ROLES } from '../../shared/auth/roles';
import { AnalysisListQuerySchema, SeriesNameSchema, SeriesQuerySchema, type AnalysisListQuery, type SeriesName, type SeriesQuery } from '../../shared/schemas/analyses';
import { z } from 'zod';
import { appContext } from '../context';
import { validate } from '../middleware/validate';
import { Analysis } from '../models/analysis';
import { Capture } from '../models/capture';
import { Case } from '../models/case';
import { presentAnalysis } from '../presenters/present-case';
import { retryAnalysis } from '../services/captures';
import { seriesInfoOf } from '../services/case-detail';
import { seriesEtag, seriesView } from '../services/series-view';
import { actorOf } from './cases';
import type { RouteRow } from './route-row';

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Analysis;
const caseIdOf = async (a: Analysis) => (await Capture.findByPk(a.captureId, { attributes: ['caseId'] }))?.caseId ?? 0;

/** Rows of the route access table for /api/analyses. */
export const analysisRoutes: RouteRow[] = [
  {
    method: 'get', path: '/analyses', roles: ROLES, summary: "the shop's analyses by status (failed jobs with their codes)",
    handlers: [validate({ query: AnalysisListQuerySchema }), async (req, res) => {
      const q = res.locals.valid.query as AnalysisListQuery;
      const where = { shopId: req.user!.shopId, ...(q.status ? { status: q.status } : {}) };
      const { rows, count } = await Analysis.findAndCountAll({ where, order: [['id', 'DESC']], limit: q.pageSize, offset: (q.page - 1) * q.pageSize });
      const captures = rows.length ? await Capture.findAll({ where: { id: rows.map((r) => r.captureId) } }) : [];
      const cases = captures.length ? await Case.findAll({ where: { id: captures.map((c) => c.caseId) }, attributes: ['id', 'roNumber'] }) : [];
      const capById = new Map(captures.map((c) => [c.id, c]));
      const caseById = new Map(cases.map((c) => [c.id, c]));
      const info = await seriesInfoOf(rows.filter((r) => r.status === 'done').map((r) => r.id));
      res.json({
        items: rows.map((a) => {
          const cap = capById.get(a.captureId);
          return { ...presentAnalysis(a, cap?.caseId ?? 0, info(a.id)), originalName: cap?.originalName ?? '', roNumber: caseById.get(cap?.caseId ?? 0)?.roNumber ?? '' };
        }),
        total: count, page: q.page, pageSize: q.pageSize,
      });
    }],
  },
  {
    method: 'get', path: '/analyses/:id', roles: ROLES, ownedParam: 'id', resource: 'analysis', summary: 'an analysis: status, progress, error, summary',
    handlers: [async (_req, res) => {
      const a = owned(res);
      const info = await seriesInfoOf(a.status === 'done' ? [a.id] : []);
      res.json({ analysis: presentAnalysis(a, await caseIdOf(a), info(a.id)) });
    }],
  },
  {
    method: 'post', path: '/analyses/:id/retry', roles: ROLES, ownedParam: 'id', resource: 'analysis', summary: 'queue a failed analysis again',
    handlers: [async (req, res) => {
      const a = await retryAnalysis(actorOf(req), owned(res).id);
      appContext(req).jobs?.wake();
      res.status(202).json({ analysis: presentAnalysis(a, await caseIdOf(a)) });
    }],
  },
  {
    method: 'get', path: '/analyses/:id/series/:name', roles: ROLES, ownedParam: 'id', resource: 'analysis', summary: 'one series of an analysis, decimated (ETag)',
    handlers: [validate({ params: z.object({ id: z.coerce.number(), name: SeriesNameSchema }), query: SeriesQuerySchema }), async (req, res) => {
      const a = owned(res);
      const name = (res.locals.valid.params as { name: SeriesName }).name;
      const q = res.locals.valid.query as SeriesQuery;
      const etag = seriesEtag(a, name, q);
      res.setHeader('Cache-Control', 'private, max-age=0, must-revalidate');
      if (a.status === 'done' && req.headers['if-none-match'] === etag) { res.setHeader('ETag', etag); res.status(304).end(); return; }
      const dto = await seriesView(a, name, q);
      res.setHeader('ETag', etag);
      res.json(dto);
    }],
  },
];
