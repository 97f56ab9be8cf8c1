// The Drive library's engines: list, read, create, update, delete, duplicate, import and export.
// Reads for every role; writes for lead and admin (docs/design.md "Who uses it").
import express, { type RequestHandler } from 'express';
import multer from 'multer';
import { LEAD_AND_ADMIN } from '../../shared/auth/access';
import { ROLES } from '../../shared/auth/roles';
import { exportFileName } from '../../shared/drive-io/analyze-document';
import { EngineListQuerySchema, type EngineListQuery } from '../../shared/schemas/engines-api';
import { AppError } from '../errors';
import { validate } from '../middleware/validate';
import type { Engine } from '../models/engine';
import { presentEngine, presentEngineSummary } from '../presenters/present-engine';
import { exportEngineCsv, exportEngineJson, importEngineCsv } from '../services/engine-io';
import { createEngine, deleteEngine, duplicateEngine, getEngine, listEngines, updateEngine } from '../services/engines';
import type { RouteRow } from './route-row';

const CSV_LIMIT_BYTES = 1024 * 1024;
const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Engine;

/** A CSV body as text/csv (or text/plain), as the `file` field of a multipart form, or as JSON `{ "csv": "…" }`. */
const readCsvBody: RequestHandler[] = [
  express.text({ type: ['text/csv', 'text/plain', 'application/csv'], limit: CSV_LIMIT_BYTES }),
  multer({ storage: multer.memoryStorage(), limits: { fileSize: CSV_LIMIT_BYTES, files: 1 } }).single('file'),
  (req, res, next) => {
    const body: unknown = req.body;
    const fromJson = body && typeof body === 'object' && typeof (body as { csv?: unknown }).csv === 'string' ? (body as { csv: string }).csv : undefined;
    const text = req.file ? req.file.buffer.toString('utf8') : typeof body === 'string' ? body : fromJson;
    if (text === undefined || text.trim() === '') {
      next(new AppError(400, 'validation_failed', 'Send the component table as a text/csv body or as the "file" field of a form', [
        { line: 1, message: 'no CSV text received' },
      ]));
      return;
    }
    res.locals.csvText = text;
    next();
  },
];

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
    handlers: [async (req, res) => void res.status(201).json(detail(await createEngine(req.user!.shopId, req.body)))],
  },
  {
    method: 'post', path: '/engines/import.json', roles: LEAD_AND_ADMIN, summary: 'import a drive document as a new engine',
    handlers: [async (req, res) => void res.status(201).json(detail(await createEngine(req.user!.shopId, req.body)))],
  },
  {
    method: 'get', path: '/engines/:id', roles: ROLES, ownedParam: 'id', resource: 'engine',
    summary: 'an engine with its drive and computed orders',
    handlers: [async (req, res) => void res.json(detail(await getEngine(req.user!.shopId, owned(res).id)))],
  },
  {
    method: 'put', path: '/engines/:id', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: "replace an engine's drive document",
    handlers: [async (req, res) => void res.json(detail(await updateEngine(req.user!.shopId, owned(res).id, req.body)))],
  },
  {
    method: 'delete', path: '/engines/:id', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: 'delete an engine no case uses',
    handlers: [async (req, res) => { await deleteEngine(req.user!.shopId, owned(res).id); res.status(204).end(); }],
  },
  {
    method: 'post', path: '/engines/:id/duplicate', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: 'copy an engine under a new name',
    handlers: [async (req, res) => void res.status(201).json(detail(await duplicateEngine(req.user!.shopId, owned(res).id)))],
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
    summary: "the engine's component table as CSV",
    handlers: [
      async (req, res) => {
        const { name, csv } = await exportEngineCsv(req.user!.shopId, owned(res).id);
        res.attachment(exportFileName(name, 'components.csv'));
        res.type('text/csv; charset=utf-8').send(csv);
      },
    ],
  },
  {
    method: 'post', path: '/engines/:id/import.csv', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: "replace an engine's components from a CSV table",
    handlers: [
      ...readCsvBody,
      async (req, res) => void res.json(detail(await importEngineCsv(req.user!.shopId, owned(res).id, res.locals.csvText as string))),
    ],
  },
];
