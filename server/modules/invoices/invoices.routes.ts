import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { issueInvoiceRequestSchema, priceListSchema } from '../../schemas/invoices';
import { invoiceCsv } from './invoice-csv';
import { writeInvoicePdf } from './invoice-pdf';
import type { InvoicesService } from './invoices.service';

const readers = ['studio_admin', 'coordinator'] as const;
const studioAdmin = ['studio_admin'] as const;

export function registerInvoicesRoutes(routes: RouteTable, invoices: InvoicesService) {
  routes.add('get', '/days/:dayId/summary', readers, async (req, res) => {
    res.json(await invoices.daySummary(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
  });

  routes.add('get', '/clients/:clientId/summary', readers, async (req, res) => {
    res.json(
      await invoices.clientSummary(viewerOf(req), parseId(req.params.clientId, 'That client')),
    );
  });

  routes.add('get', '/clients/:clientId/price-list', readers, async (req, res) => {
    res.json(await invoices.priceList(viewerOf(req), parseId(req.params.clientId, 'That client')));
  });

  routes.add('put', '/clients/:clientId/price-list', studioAdmin, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const prices = parseInput(priceListSchema, req.body);
    res.json(await invoices.savePriceList(viewerOf(req), clientId, prices));
  });

  routes.add('post', '/days/:dayId/invoice', studioAdmin, async (req, res) => {
    const dayId = parseId(req.params.dayId, 'That shoot day');
    parseInput(issueInvoiceRequestSchema, req.body ?? {});
    const issued = await invoices.issueDayInvoice(viewerOf(req), dayId);
    res.status(issued.created ? 201 : 200).json(issued);
  });

  routes.add('get', '/invoices/:invoiceId', readers, async (req, res) => {
    res.json(await invoices.invoice(viewerOf(req), parseId(req.params.invoiceId, 'That invoice')));
  });

  routes.add('get', '/invoices/:invoiceId/invoice.csv', readers, async (req, res) => {
    const invoice = await invoices.invoice(
      viewerOf(req),
      parseId(req.params.invoiceId, 'That invoice'),
    );
    const { fileName, csv } = invoiceCsv(invoice);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    res.send(csv);
  });

  routes.add('get', '/invoices/:invoiceId/invoice.pdf', readers, async (req, res) => {
    const invoice = await invoices.invoice(
      viewerOf(req),
      parseId(req.params.invoiceId, 'That invoice'),
    );
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `attachment; filename="${invoice.number}.pdf"`);
    await writeInvoicePdf(invoice, res);
  });
}
