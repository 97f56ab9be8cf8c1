// Cases: list, create, read, update, the status moves and the captures upload (docs/api.md).
// Every role works cases; decisions on suspects are for specialists up, sign-off for leads up.
import type { Request } from 'express';
import { LEAD_AND_ADMIN } from '../../shared/auth/access';
import { ROLES, type Role } from '../../shared/auth/roles';
import { CaseListQuerySchema, CaseMoveSchema, ConfirmCauseSchema, CreateCaseSchema, UpdateCaseSchema, type CaseListQuery } from '../../shared/schemas/cases';
import { appContext } from '../context';
import { validate } from '../middleware/validate';
import type { Case } from '../models/case';
import { presentCaseListItem, presentPerson } from '../presenters/present-case';
import { receiveCaptures, type StoredUpload } from '../services/capture-upload';
import { assertTakesCaptures, createCaptures } from '../services/captures';
import { getCaseDetail } from '../services/case-detail';
import { advanceCase, completeCase, confirmCause, rerankCase, reopenCase } from '../services/case-status';
import { type Actor, casePeople, createCase, listCases, updateCase } from '../services/cases';
import type { RouteRow } from './route-row';
import type { UploadMetadata } from '../../shared/schemas/captures';

/** Specialists, leads and admins: dismiss and restore suspects, re-rank. */
export const SPECIALIST_UP: readonly Role[] = ['specialist', 'lead', 'admin'];

/** The signed-in user as the services take them. */
export const actorOf = (req: Request): Actor => ({ id: req.user!.id, shopId: req.user!.shopId, role: req.user!.role, name: req.user!.name });
const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Case;
const detail = async (req: Request, id: number) => ({ case: await getCaseDetail(req.user!.shopId, id) });
const notifier = (req: Request) => {
  const ctx = appContext(req);
  return { mailer: ctx.mailer, publicUrl: ctx.publicUrl, logger: req.log ?? ctx.logger };
};

/** Rows of the route access table for /api/cases. */
export const caseRoutes: RouteRow[] = [
  {
    method: 'get', path: '/cases/people', roles: ROLES, summary: 'who can be assigned as technician or lead',
    handlers: [async (req, res) => {
      const p = await casePeople(req.user!.shopId);
      res.json({ technicians: p.technicians.map((u) => presentPerson(u)), leads: p.leads.map((u) => presentPerson(u)) });
    }],
  },
  {
    method: 'get', path: '/cases', roles: ROLES, summary: "the shop's cases (filter, search, sort, page)",
    handlers: [
      validate({ query: CaseListQuerySchema }),
      async (req, res) => {
        const page = await listCases(req.user!.shopId, res.locals.valid.query as CaseListQuery);
        res.json({ items: page.rows.map((r) => presentCaseListItem(r.c, r.captureCount, r.top)), total: page.total, page: page.page, pageSize: page.pageSize });
      },
    ],
  },
  {
    method: 'post', path: '/cases', roles: ROLES, summary: 'open a case for a repair order',
    handlers: [validate({ body: CreateCaseSchema }), async (req, res) => {
      const c = await createCase(actorOf(req), req.body);
      res.status(201).json(await detail(req, c.id));
    }],
  },
  {
    method: 'get', path: '/cases/:id', roles: ROLES, ownedParam: 'id', resource: 'case', summary: 'a case with its captures, suspects and timeline',
    handlers: [async (req, res) => void res.json(await detail(req, owned(res).id))],
  },
  {
    method: 'patch', path: '/cases/:id', roles: ROLES, ownedParam: 'id', resource: 'case', summary: "change a case's details",
    handlers: [validate({ body: UpdateCaseSchema }), async (req, res) => {
      await updateCase(actorOf(req), owned(res).id, req.body);
      res.json(await detail(req, owned(res).id));
    }],
  },
  {
    method: 'post', path: '/cases/:id/captures', roles: ROLES, ownedParam: 'id', resource: 'case', summary: 'upload captures (multipart: metadata, then files)',
    handlers: [
      (req, res, next) => {
        // Refuse before streaming when the case takes no captures at all.
        const c = owned(res);
        if (c.status === 'closed' || c.status === 'verified') {
          try { assertTakesCaptures(c, 'after_repair'); } catch (e) { next(e); return; }
        }
        next();
      },
      receiveCaptures(),
      async (req, res) => {
        const ctx = appContext(req);
        const rows = await createCaptures(actorOf(req), owned(res).id, res.locals.uploads as StoredUpload[], res.locals.uploadMetadata as UploadMetadata, ctx.storage);
        ctx.jobs?.wake();
        const ids = new Set(rows.map((r) => r.id));
        const d = await getCaseDetail(req.user!.shopId, owned(res).id);
        res.status(201).json({ captures: d.captures.filter((x) => ids.has(x.id)) });
      },
    ],
  },
  {
    method: 'post', path: '/cases/:id/complete', roles: ROLES, ownedParam: 'id', resource: 'case', summary: 'captures complete: rank the case',
    handlers: [async (req, res) => {
      await completeCase(actorOf(req), owned(res).id, notifier(req));
      res.json(await detail(req, owned(res).id));
    }],
  },
  {
    method: 'post', path: '/cases/:id/rerank', roles: SPECIALIST_UP, ownedParam: 'id', resource: 'case', summary: 're-rank with the current engine',
    handlers: [async (req, res) => {
      await rerankCase(actorOf(req), owned(res).id);
      res.json(await detail(req, owned(res).id));
    }],
  },
  {
    method: 'post', path: '/cases/:id/confirm', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'case', summary: 'confirm the cause',
    handlers: [validate({ body: ConfirmCauseSchema }), async (req, res) => {
      await confirmCause(actorOf(req), owned(res).id, req.body);
      res.json(await detail(req, owned(res).id));
    }],
  },
  {
    method: 'post', path: '/cases/:id/reopen', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'case', summary: 're-open a ranked or confirmed case',
    handlers: [validate({ body: CaseMoveSchema }), async (req, res) => {
      await reopenCase(actorOf(req), owned(res).id, req.body.note);
      res.json(await detail(req, owned(res).id));
    }],
  },
  {
    method: 'post', path: '/cases/:id/verify', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'case', summary: 'mark the repair verified',
    handlers: [validate({ body: CaseMoveSchema }), async (req, res) => {
      await advanceCase(actorOf(req), owned(res).id, 'verified', req.body.note);
      res.json(await detail(req, owned(res).id));
    }],
  },
  {
    method: 'post', path: '/cases/:id/close', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'case', summary: 'close a verified case',
    handlers: [validate({ body: CaseMoveSchema }), async (req, res) => {
      await advanceCase(actorOf(req), owned(res).id, 'closed', req.body.note);
      res.json(await detail(req, owned(res).id));
    }],
  },
];
