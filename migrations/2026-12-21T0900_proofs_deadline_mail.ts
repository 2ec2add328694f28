import { sql, type Kysely } from 'kysely';

/** A mailing for a moved pick deadline: sitters already sent their proofs hear the new date. */
export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table day_mailings drop constraint day_mailings_kind_check`.execute(db);
  await sql`alter table day_mailings add constraint day_mailings_kind_check
    check (kind in ('invitation', 'reminder', 'day_before', 'proofs', 'proofs_reminder',
      'proofs_deadline', 'portraits_ready'))`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`delete from day_mailings where kind = 'proofs_deadline'`.execute(db);
  await sql`alter table day_mailings drop constraint day_mailings_kind_check`.execute(db);
  await sql`alter table day_mailings add constraint day_mailings_kind_check
    check (kind in ('invitation', 'reminder', 'day_before', 'proofs', 'proofs_reminder',
      'portraits_ready'))`.execute(db);
}
