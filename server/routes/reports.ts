// The case report (PDF, e-mail to the service advisor) and the case export (zip), issue 16 item 7.
// Every role may read them; sending is the lead's (or admin's), who signs the case off.
import { z } from 'zod';
import { LEAD_AND_ADMIN } from '../../shared/auth/access';
import { ROLES } from '../../shared/auth/roles';
import { EmailSchema } from '../../shared/schemas/common';
import { appContext } from '../context';
import { validate } from '../middleware/validate';
import type { Case } from '../models/case';
import { caseExportZip, caseReport, reportFileName, sendCaseReport } from '../services/case-report';
import type { RouteRow } from './route-row';

const ReportQuerySchema = z.object({ copy: z.enum(['advisor', 'customer']).default('advisor') });
const SendReportSchema = z.object({
  copy: z.enum(['advisor', 'customer']).default('advisor'),
  /** Another address than the case's service advisor (optional). */
  to: z.union([z.literal(''), EmailSchema]).optional(),
});

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Case;

/** Rows of the route access table for the report and the export. */
export const reportRoutes: RouteRow[] = [
  {
    method: 'get', path: '/cases/:id/report.pdf', roles: ROLES, ownedParam: 'id', resource: 'case', summary: "the case's report as PDF (advisor or customer copy)",
    handlers: [validate({ query: ReportQuerySchema }), async (req, res) => {
      const { copy } = res.locals.valid.query as z.infer<typeof ReportQuerySchema>;
      const { pdf, caseDto } = await caseReport(req.user!.shopId, owned(res).id, copy);
      res.setHeader('Content-Disposition', `inline; filename="${reportFileName(caseDto.roNumber, copy)}"`);
      res.type('application/pdf').send(pdf);
    }],
  },
  {
    method: 'post', path: '/cases/:id/report/send', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'case', summary: 'mail the report to the service advisor',
    handlers: [validate({ body: SendReportSchema }), async (req, res) => {
      const ctx = appContext(req);
      const body = req.body as z.infer<typeof SendReportSchema>;
      const u = req.user!;
      res.json(await sendCaseReport({ id: u.id, shopId: u.shopId, name: u.name }, owned(res).id, { copy: body.copy, to: body.to }, { mailer: ctx.mailer, publicUrl: ctx.publicUrl }));
    }],
  },
  {
    method: 'get', path: '/cases/:id/export.zip', roles: ROLES, ownedParam: 'id', resource: 'case', summary: 'the case export: captures, results, report PDF',
    handlers: [async (req, res) => {
      const { name, zip } = await caseExportZip(req.user!.shopId, owned(res).id, appContext(req).storage);
      res.attachment(name);
      res.type('application/zip').send(Buffer.from(zip.buffer, zip.byteOffset, zip.byteLength));
    }],
  },
];
