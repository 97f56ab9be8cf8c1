// Captures: read, delete, re-analyse, list analyses, and the Listen audio with range requests.
import { createHash } from 'node:crypto';
import { ROLES } from '../../shared/auth/roles';
import { ReanalyzeSchema } from '../../shared/schemas/captures';
import { appContext } from '../context';
import { AppError } from '../errors';
import { validate } from '../middleware/validate';
import { Analysis } from '../models/analysis';
import type { Capture } from '../models/capture';
import { User } from '../models/user';
import { presentAnalysis, presentCapture } from '../presenters/present-case';
import { captureAudio } from '../services/capture-audio';
import { deleteCapture, reanalyzeCapture } from '../services/captures';
import { seriesInfoOf } from '../services/case-detail';
import { actorOf } from './cases';
import type { RouteRow } from './route-row';

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Capture;

async function captureDto(c: Capture) {
  const analyses = await Analysis.findAll({ where: { captureId: c.id }, order: [['id', 'DESC']] });
  const current = analyses.find((a) => a.id === c.currentAnalysisId) ?? null;
  const info = await seriesInfoOf(current && current.status === 'done' ? [current.id] : []);
  const uploader = c.uploadedById ? await User.findOne({ where: { id: c.uploadedById, shopId: c.shopId } }) : null;
  return presentCapture(c, current ? presentAnalysis(current, c.caseId, info(current.id)) : null, analyses.map((a) => a.id), uploader);
}

/** Parses one `bytes=a-b` range against `size`; null = whole file, 'bad' = unsatisfiable. */
export function parseRange(header: string | undefined, size: number): { start: number; end: number } | null | 'bad' {
  if (!header) return null;
  const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
  if (!m || (m[1] === '' && m[2] === '')) return 'bad';
  let start: number;
  let end: number;
  if (m[1] === '') {
    const suffix = Number(m[2]);
    if (suffix === 0) return 'bad';
    start = Math.max(0, size - suffix);
    end = size - 1;
  } else {
    start = Number(m[1]);
    end = m[2] === '' ? size - 1 : Math.min(Number(m[2]), size - 1);
  }
  if (start >= size || end < start) return 'bad';
  return { start, end };
}

/** Rows of the route access table for /api/captures. */
export const captureRoutes: RouteRow[] = [
  {
    method: 'get', path: '/captures/:id', roles: ROLES, ownedParam: 'id', resource: 'capture', summary: 'a capture with its current analysis',
    handlers: [async (_req, res) => void res.json({ capture: await captureDto(owned(res)) })],
  },
  {
    method: 'delete', path: '/captures/:id', roles: ROLES, ownedParam: 'id', resource: 'capture', summary: 'delete a capture before ranking (technicians: their own)',
    handlers: [async (req, res) => {
      await deleteCapture(actorOf(req), owned(res).id, appContext(req).storage);
      res.status(204).end();
    }],
  },
  {
    method: 'get', path: '/captures/:id/analyses', roles: ROLES, ownedParam: 'id', resource: 'capture', summary: "a capture's analyses, newest first",
    handlers: [async (_req, res) => {
      const c = owned(res);
      const analyses = await Analysis.findAll({ where: { captureId: c.id }, order: [['id', 'DESC']] });
      const info = await seriesInfoOf(analyses.filter((a) => a.status === 'done').map((a) => a.id));
      res.json({ items: analyses.map((a) => presentAnalysis(a, c.caseId, info(a.id))) });
    }],
  },
  {
    method: 'post', path: '/captures/:id/analyses', roles: ROLES, ownedParam: 'id', resource: 'capture', summary: 'analyse a capture again with other settings',
    handlers: [validate({ body: ReanalyzeSchema }), async (req, res) => {
      const a = await reanalyzeCapture(actorOf(req), owned(res).id, req.body.settings);
      appContext(req).jobs?.wake();
      res.status(202).json({ analysis: presentAnalysis(a, owned(res).caseId) });
    }],
  },
  {
    method: 'get', path: '/captures/:id/audio', roles: ROLES, ownedParam: 'id', resource: 'capture', summary: 'the pickup channel as 48 kHz WAV (range requests)',
    handlers: [async (req, res) => {
      const c = owned(res);
      const wav = await captureAudio(c, appContext(req).storage);
      const etag = `"a-${createHash('sha256').update(c.sha256).update('listen48k-v1').digest('base64url').slice(0, 22)}"`;
      res.setHeader('Accept-Ranges', 'bytes');
      res.setHeader('ETag', etag);
      res.setHeader('Cache-Control', 'private, max-age=0, must-revalidate');
      res.type('audio/wav');
      if (req.headers['if-none-match'] === etag && !req.headers.range) { res.status(304).end(); return; }
      const range = parseRange(req.headers.range, wav.length);
      if (range === 'bad') {
        res.setHeader('Content-Range', `bytes */${wav.length}`);
        throw new AppError(416, 'range_not_satisfiable', `The range asked for is outside the ${wav.length}-byte file`);
      }
      if (!range) { res.setHeader('Content-Length', String(wav.length)); res.end(wav); return; }
      res.status(206);
      res.setHeader('Content-Range', `bytes ${range.start}-${range.end}/${wav.length}`);
      res.setHeader('Content-Length', String(range.end - range.start + 1));
      res.end(wav.subarray(range.start, range.end + 1));
    }],
  },
];
