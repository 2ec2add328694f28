import type { Clock } from '../../adapters/clock';
import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type {
  ClientSummary,
  DayCounts,
  DaySummary,
  Invoice,
  InvoiceRef,
  InvoiceIssuer,
  InvoiceSnapshot,
  PriceList,
  PriceListAnswer,
} from '../../schemas/invoices';
import { findClientName } from '../clients/clients.repository';
import * as daysRepo from '../days/days.repository';
import type { DaysService } from '../days/days.service';
import { invoiceLines, invoiceNumber } from './invoice-lines';
import * as repo from './invoices.repository';

export type InvoicesService = ReturnType<typeof createInvoicesService>;

const toRef = (row: { id: string; number: string; issuedAt: Date }): InvoiceRef => ({
  id: row.id,
  number: row.number,
  issuedAt: row.issuedAt.toISOString(),
});

function addCounts(total: DayCounts, counts: DayCounts) {
  for (const key of Object.keys(total) as Array<keyof DayCounts>) total[key] += counts[key];
}

const zeroCounts = (): DayCounts => ({
  invited: 0,
  booked: 0,
  checkedIn: 0,
  walkIns: 0,
  photographed: 0,
  noShows: 0,
  missed: 0,
  picks: 0,
  extraPicks: 0,
  retouchesDone: 0,
  renditionsDelivered: 0,
  extraRenditions: 0,
  stations: 0,
});

/**
 * A day's figures from its own records, and the client's invoice for it. The studio admin
 * sets prices and issues; a coordinator reads their own client's figures and invoices.
 */
export function createInvoicesService(deps: {
  db: Db;
  clock: Clock;
  days: DaysService;
  issuer: InvoiceIssuer;
}) {
  const { db, clock, days } = deps;

  /** A coordinator asking about another client learns nothing, not even that it exists. */
  async function visibleClient(viewer: Viewer, clientId: string): Promise<string> {
    if (viewer.role === 'coordinator' && viewer.clientId !== clientId)
      throw notFound('That client');
    const name = await findClientName(db, clientId);
    if (name === undefined) throw notFound('That client');
    return name;
  }

  async function savedPrices(clientId: string): Promise<PriceList | null> {
    const row = await repo.findPriceList(db, clientId);
    if (!row) return null;
    const { updatedAt: _updatedAt, ...prices } = row;
    return prices;
  }

  return {
    async daySummary(viewer: Viewer, dayId: string): Promise<DaySummary> {
      const day = await days.visibleDay(viewer, dayId);
      const prices = await savedPrices(day.clientId);
      const [counts, byOffice, [issued]] = await Promise.all([
        repo.dayCounts(db, day, prices?.renditionsIncluded ?? 0),
        repo.officeFigures(db, day),
        repo.invoiceRefs(db, [day.id]),
      ]);
      return {
        dayId: day.id,
        clientId: day.clientId,
        clientName: day.clientName,
        officeName: day.officeName,
        date: day.date,
        counts,
        byOffice,
        draft: prices ? invoiceLines(counts, prices) : null,
        invoice: issued ? toRef(issued) : null,
      };
    },

    async clientSummary(viewer: Viewer, clientId: string): Promise<ClientSummary> {
      const clientName = await visibleClient(viewer, clientId);
      const prices = await savedPrices(clientId);
      const list = await daysRepo.listDays(db, { clientId });
      const refs = await repo.invoiceRefs(
        db,
        list.map((day) => day.id),
      );
      const totals = zeroCounts();
      const rows = [];
      for (const day of list) {
        const counts = await repo.dayCounts(db, day, prices?.renditionsIncluded ?? 0);
        addCounts(totals, counts);
        const issued = refs.find((ref) => ref.dayId === day.id);
        rows.push({
          dayId: day.id,
          officeName: day.officeName,
          date: day.date,
          counts,
          invoice: issued ? toRef(issued) : null,
        });
      }
      return { clientId, clientName, totals, days: rows };
    },

    async priceList(viewer: Viewer, clientId: string): Promise<PriceListAnswer> {
      await visibleClient(viewer, clientId);
      const row = await repo.findPriceList(db, clientId);
      if (row) {
        const { updatedAt, ...priceList } = row;
        return { saved: true, updatedAt: updatedAt.toISOString(), priceList };
      }
      // A first price list starts from the package's price per extra pick.
      return {
        saved: false,
        updatedAt: null,
        priceList: {
          currency: 'GBP',
          dayRateMinor: 0,
          perStationMinor: 0,
          perPersonMinor: 0,
          perExtraPickMinor: await repo.packagePrice(db, clientId),
          perRetouchMinor: 0,
          perExtraRenditionMinor: 0,
          renditionsIncluded: 0,
          taxRateBasisPoints: 0,
        },
      };
    },

    async savePriceList(
      viewer: Viewer,
      clientId: string,
      prices: PriceList,
    ): Promise<PriceListAnswer> {
      await visibleClient(viewer, clientId);
      const saved = await db.transaction().execute(async (trx) => {
        const row = await repo.savePriceList(trx, clientId, prices, viewer.id);
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'invoices.price_list_saved',
          subjectType: 'client',
          subjectId: clientId,
          details: { ...prices },
        });
        return row;
      });
      return { saved: true, updatedAt: saved.updatedAt.toISOString(), priceList: prices };
    },

    /**
     * Issues the day's invoice once: a second call answers the invoice already issued. The day's
     * row lock makes two issuers wait for each other; the year's sequence row gives the number.
     */
    async issueDayInvoice(
      viewer: Viewer,
      dayId: string,
    ): Promise<{ created: boolean; invoice: InvoiceRef }> {
      const day = await days.visibleDay(viewer, dayId);
      return db.transaction().execute(async (trx) => {
        await daysRepo.lockDay(trx, day.id);
        const [existing] = await repo.invoiceRefs(trx, [day.id]);
        if (existing) return { created: false, invoice: toRef(existing) };
        const row = await repo.findPriceList(trx, day.clientId);
        if (!row) {
          throw new AppError(
            'no_price_list',
            409,
            `Set ${day.clientName}'s price list first: the invoice is worked out from it.`,
          );
        }
        const { updatedAt: _updatedAt, ...priceList } = row;
        const counts = await repo.dayCounts(trx, day, priceList.renditionsIncluded);
        const snapshot: InvoiceSnapshot = {
          ...invoiceLines(counts, priceList),
          issuer: deps.issuer,
          clientName: day.clientName,
          officeName: day.officeName,
          dayDate: day.date,
          counts,
          priceList,
        };
        const issuedAt = clock.now();
        const year = issuedAt.getUTCFullYear();
        const sequence = await repo.takeInvoiceSequence(trx, year);
        const number = invoiceNumber(year, sequence);
        const { id } = await repo.insertInvoice(trx, {
          number,
          year,
          sequence,
          clientId: day.clientId,
          dayId: day.id,
          snapshot,
          issuedAt,
          issuedByUserId: viewer.id,
        });
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'invoices.issued',
          subjectType: 'invoice',
          subjectId: id,
          details: { number, dayId: day.id, totalMinor: snapshot.totalMinor },
        });
        return { created: true, invoice: { id, number, issuedAt: issuedAt.toISOString() } };
      });
    },

    async invoice(viewer: Viewer, invoiceId: string): Promise<Invoice> {
      const row = await repo.findInvoice(db, invoiceId);
      if (!row || (viewer.role === 'coordinator' && viewer.clientId !== row.clientId)) {
        throw notFound('That invoice');
      }
      return {
        ...row.snapshot,
        id: row.id,
        number: row.number,
        dayId: row.dayId,
        clientId: row.clientId,
        issuedAt: row.issuedAt.toISOString(),
      };
    },
  };
}
