import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import { PLANNING_ESTIMATE_STATEMENT } from '../../shared/safety/cautions';
import { currentUser } from '../accounts/current-user';
import { economicsOverridesSchema } from '../economics/economics-parameters';
import { parseOrThrow } from '../lib/validate';
import type { MailService } from '../mail/mail.service';
import { shortlistCsv } from './shortlist-csv';
import { shortlistReportPdf } from './shortlist-report';
import type { ShortlistService, ShortlistView } from './shortlist.service';

/** The shortlist query: the site, and any economic parameter (or the recovery) as a what-if override. */
const shortlistQuerySchema = economicsOverridesSchema.extend({ site: z.uuid('name the site by its id: ?site=…') });

/** Sending the report: to whom, for which site, with the same overrides the screen shows. */
const sendSchema = z.strictObject({
  site: z.uuid('name the site by its id'),
  to: z.array(z.email('each recipient is an e-mail address')).min(1, 'name at least one recipient').max(10, 'at most 10 recipients'),
  overrides: economicsOverridesSchema.default({}),
});

function reportName(view: ShortlistView, extension: 'pdf' | 'csv'): string {
  return `heapsight-shortlist-${view.site.code}-${view.generatedAt.slice(0, 10)}.${extension}`;
}

function download(response: Response, filename: string, contentType: string, body: Buffer | string): void {
  response.setHeader('Content-Type', contentType);
  response.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
  response.setHeader('Cache-Control', 'no-store');
  response.send(body);
}

/**
 * `GET /api/shortlist?site=…` (with overrides), its report as PDF and CSV, and
 * `POST /api/shortlist/report/send` (the report by e-mail, through the system's one mail path).
 */
export function shortlistRoutes(shortlist: ShortlistService, mail: MailService): Router {
  const router = Router();

  async function viewFor(request: Request): Promise<ShortlistView> {
    const user = currentUser(request);
    const { site, ...overrides } = parseOrThrow(shortlistQuerySchema, request.query, 'query');
    return shortlist.build(user, site, overrides);
  }

  router.get('/shortlist', async (request, response) => {
    response.json(await viewFor(request));
  });

  router.get('/shortlist/report.pdf', async (request, response) => {
    const view = await viewFor(request);
    download(response, reportName(view, 'pdf'), 'application/pdf', await shortlistReportPdf(view));
  });

  router.get('/shortlist/report.csv', async (request, response) => {
    const view = await viewFor(request);
    // A byte-order mark so spreadsheets read the file as UTF-8.
    download(response, reportName(view, 'csv'), 'text/csv; charset=utf-8', `\uFEFF${shortlistCsv(view)}`);
  });

  router.post('/shortlist/report/send', async (request, response) => {
    const user = currentUser(request);
    const { site, to, overrides } = parseOrThrow(sendSchema, request.body, 'report e-mail');
    const view = await shortlist.build(user, site, overrides);
    const ranked = view.rows.filter((row) => row.rank !== null).slice(0, 5);
    const money = (value: number | null) => (value === null ? '-' : `${Math.round(value).toLocaleString('en-US')} ${view.parameters.currency}`);
    const text = [
      `Shortlist for ${view.site.name} (${view.site.code}), made by ${user.name} on ${view.generatedAt.slice(0, 10)}.`,
      '',
      ranked.length > 0 ? 'Best piles by net value:' : 'No pile has enough data to rank yet.',
      ...ranked.map((row) => `  ${row.rank}. ${row.code}: net ${money(row.netValue)} (conservative ${money(row.conservativeNetValue)})`),
      '',
      `Gold price ${view.parameters.goldPricePerTroyOz} ${view.parameters.currency}/troy oz, recovery ${(view.parameters.recovery * 100).toFixed(1)} %.`,
      'The full report (PDF) and the table (CSV) are attached.',
      '',
      PLANNING_ESTIMATE_STATEMENT,
    ].join('\n');
    const sent = await mail.sendMail({
      to, subject: `Heapsight shortlist: ${view.site.name} (${view.site.code})`, text, organizationId: user.organizationId,
      attachments: [
        { filename: reportName(view, 'pdf'), content: await shortlistReportPdf(view), contentType: 'application/pdf' },
        { filename: reportName(view, 'csv'), content: `\uFEFF${shortlistCsv(view)}`, contentType: 'text/csv; charset=utf-8' },
      ],
    });
    response.status(202).json(sent);
  });

  return router;
}
