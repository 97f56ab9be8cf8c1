// The Drive library's engines: list, read, create, update, delete, duplicate, import and export.
// Reads for every role; writes for lead and admin (docs/design.md "Who uses it").
import express, { type Request, type RequestHandler } from 'express';
import multer from 'multer';
import { LEAD_AND_ADMIN } from '../../shared/auth/access';
import { ROLES } from '../../shared/auth/roles';
import { exportFileName } from '../../shared/drive-io/analyze-document';
import { EngineListQuerySchema, type EngineListQuery } from '../../shared/schemas/engines-api';
import { AppError } from '../errors';
import { validate } from '../middleware/validate';
import type { Engine } from '../models/engine';
import { presentEngine, presentEngineSummary, presentRevision } from '../presenters/present-engine';
import { createEngineFromCsv, exportComponentsCsv, exportEngineCsv, exportEngineJson, importEngineCsv, previewEngineCsv } from '../services/engine-io';
import { createEngine, deleteEngine, duplicateEngine, engineHistory, getEngine, listEngines, updateEngine, type EngineWriter } from '../services/engines';
import type { RouteRow } from './route-row';

const CSV_LIMIT_BYTES = 1024 * 1024;
const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Engine;
const writerOf = (req: Request): EngineWriter => ({ id: req.user!.id, name: req.user!.name });

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: CSV_LIMIT_BYTES, files: 1, fields: 10, parts: 12 } }).single('file');

/** Multer's and busboy's errors in the user's words: too large → 413, anything malformed → 400 (never 500). */
export function uploadError(error: unknown): AppError {
  if (error instanceof multer.MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') return new AppError(413, 'payload_too_large', `The file is larger than ${CSV_LIMIT_BYTES / 1024 / 1024} MB; an engine's CSV is a few kilobytes`);
    if (error.code === 'LIMIT_UNEXPECTED_FILE') {
      return new AppError(400, 'bad_request', error.field === 'file' ? 'Send one file only' : `Send the CSV as the form field "file" (got "${error.field ?? ''}")`);
    }
    if (error.code === 'LIMIT_FILE_COUNT') return new AppError(400, 'bad_request', 'Send one file only');
    return new AppError(400, 'bad_request', 'The upload form is not what Crankwise expects; send one CSV file as the field "file"');
  }
  if (error instanceof AppError) return error;
  return new AppError(400, 'bad_request', 'The upload was cut off or malformed; choose the file and try again');
}

const uploadCsv: RequestHandler = (req, res, next) => {
  if (!req.is('multipart/form-data')) { next(); return; }
  upload(req, res, (error: unknown) => next(error ? uploadError(error) : undefined));
};

/** A CSV body as text/csv (or text/plain), as the `file` field of a multipart form, or as JSON `{ "csv": "…" }`. */
const readCsvBody: RequestHandler[] = [
  express.text({ type: ['text/csv', 'text/plain', 'application/csv'], limit: CSV_LIMIT_BYTES }),
  uploadCsv,
  (req, res, next) => {
    const body: unknown = req.body;
    const fromJson = body && typeof body === 'object' && typeof (body as { csv?: unknown }).csv === 'string' ? (body as { csv: string }).csv : undefined;
    const text = req.file ? req.file.buffer.toString('utf8') : typeof body === 'string' ? body : fromJson;
    if (text === undefined || text.trim() === '') {
      next(new AppError(400, 'validation_failed', 'Send the CSV as a text/csv body or as the "file" field of a form', [
        { line: 1, message: 'No CSV text was received' },
      ]));
      return;
    }
    if (text.length > CSV_LIMIT_BYTES) {
      next(new AppError(413, 'payload_too_large', `The file is larger than ${CSV_LIMIT_BYTES / 1024 / 1024} MB; an engine's CSV is a few kilobytes`));
      return;
    }
    res.locals.csvText = text;
    next();
  },
];

/** The version an import names: `?version=` or a `version` field of the JSON or form body; undefined when absent. */
function importVersion(req: Request): number | undefined {
  const raw = (req.query as Record<string, unknown>).version ?? (req.body && typeof req.body === 'object' ? (req.body as Record<string, unknown>).version : undefined);
  if (raw === undefined || raw === '') return undefined;
  const v = Number(raw);
  if (!Number.isInteger(v) || v < 1) throw new AppError(400, 'validation_failed', 'The version must be a whole number (reload the page and try again)', [{ path: 'version', message: 'not a whole number' }]);
  return v;
}

const detail = (result: Awaited<ReturnType<typeof getEngine>>) => ({ engine: presentEngine(result.engine, result.doc, result.shopTable) });

/** Rows of the route access table for /api/engines. */
export const engineRoutes: RouteRow[] = [
  {
    method: 'get', path: '/engines', roles: ROLES, summary: "the shop's engines (search, sort, page)",
    handlers: [
      validate({ query: EngineListQuerySchema }),
      async (req, res) => {
        const page = await listEngines(req.user!.shopId, res.locals.valid.query as EngineListQuery);
        res.json({ items: page.rows.map((r) => presentEngineSummary(r.engine, r.belts, r.components)), total: page.total, page: page.page, pageSize: page.pageSize });
      },
    ],
  },
  {
    method: 'post', path: '/engines', roles: LEAD_AND_ADMIN, summary: 'create an engine from a drive document',
    handlers: [async (req, res) => void res.status(201).json(detail(await createEngine(req.user!.shopId, req.body, writerOf(req))))],
  },
  {
    method: 'post', path: '/engines/import.json', roles: LEAD_AND_ADMIN, summary: 'import a drive document as a new engine',
    handlers: [async (req, res) => void res.status(201).json(detail(await createEngine(req.user!.shopId, req.body, writerOf(req), 'import')))],
  },
  {
    method: 'post', path: '/engines/import.csv', roles: LEAD_AND_ADMIN, summary: 'create an engine from a whole-engine CSV',
    handlers: [
      ...readCsvBody,
      async (req, res) => {
        const result = await createEngineFromCsv(req.user!.shopId, res.locals.csvText as string, writerOf(req));
        res.status(201).json({ ...detail(result), imported: { rows: result.rows } });
      },
    ],
  },
  {
    method: 'get', path: '/engines/:id', roles: ROLES, ownedParam: 'id', resource: 'engine',
    summary: 'an engine with its drive and computed orders',
    handlers: [async (req, res) => void res.json(detail(await getEngine(req.user!.shopId, owned(res).id)))],
  },
  {
    method: 'get', path: '/engines/:id/history', roles: ROLES, ownedParam: 'id', resource: 'engine',
    summary: "an engine's edit history (who changed what, newest first)",
    handlers: [async (req, res) => void res.json({ items: (await engineHistory(req.user!.shopId, owned(res).id)).map(presentRevision) })],
  },
  {
    method: 'put', path: '/engines/:id', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: "replace an engine's drive document (with the version edited)",
    handlers: [async (req, res) => void res.json(detail(await updateEngine(req.user!.shopId, owned(res).id, req.body, writerOf(req))))],
  },
  {
    method: 'delete', path: '/engines/:id', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: 'delete an engine no case uses',
    handlers: [async (req, res) => { await deleteEngine(req.user!.shopId, owned(res).id); res.status(204).end(); }],
  },
  {
    method: 'post', path: '/engines/:id/duplicate', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: 'copy an engine under a new name',
    handlers: [async (req, res) => void res.status(201).json(detail(await duplicateEngine(req.user!.shopId, owned(res).id, writerOf(req))))],
  },
  {
    method: 'get', path: '/engines/:id/export.json', roles: ROLES, ownedParam: 'id', resource: 'engine',
    summary: 'the engine as the analyze --drive document',
    handlers: [
      async (req, res) => {
        const doc = await exportEngineJson(req.user!.shopId, owned(res).id);
        res.attachment(exportFileName(doc.name, 'drive.json'));
        res.type('application/json').send(`${JSON.stringify(doc, null, 2)}\n`);
      },
    ],
  },
  {
    method: 'get', path: '/engines/:id/export.csv', roles: ROLES, ownedParam: 'id', resource: 'engine',
    summary: 'the whole engine (fields, belts, components) as CSV',
    handlers: [
      async (req, res) => {
        const { name, csv } = await exportEngineCsv(req.user!.shopId, owned(res).id);
        res.attachment(exportFileName(name, 'engine.csv'));
        res.type('text/csv; charset=utf-8').send(csv);
      },
    ],
  },
  {
    method: 'get', path: '/engines/:id/components.csv', roles: ROLES, ownedParam: 'id', resource: 'engine',
    summary: "the engine's component table alone as CSV",
    handlers: [
      async (req, res) => {
        const { name, csv } = await exportComponentsCsv(req.user!.shopId, owned(res).id);
        res.attachment(exportFileName(name, 'components.csv'));
        res.type('text/csv; charset=utf-8').send(csv);
      },
    ],
  },
  {
    method: 'post', path: '/engines/:id/import.csv', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: 'replace an engine (whole-engine CSV) or its components (component table); ?preview=1 only shows the changes',
    handlers: [
      ...readCsvBody,
      async (req, res) => {
        const csv = res.locals.csvText as string;
        if (['1', 'true'].includes(String((req.query as Record<string, unknown>).preview ?? ''))) {
          res.json({ preview: await previewEngineCsv(req.user!.shopId, owned(res).id, csv) });
          return;
        }
        const result = await importEngineCsv(req.user!.shopId, owned(res).id, csv, importVersion(req), writerOf(req));
        res.json({ ...detail(result), imported: { rows: result.rows } });
      },
    ],
  },
];
