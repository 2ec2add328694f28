import type { ColumnType } from 'kysely';

export interface CaughtMailAttachmentRecord {
  filename: string;
  contentType: string;
  /** base64 */
  content: string;
}

/** Mail the local catcher received (development only). */
export interface CaughtMailsTable {
  id: string;
  receivedAt: ColumnType<Date, Date | string | undefined, Date | string>;
  fromText: string;
  replyTo: ColumnType<string, string | undefined, string>;
  toAddresses: string[];
  subject: string;
  textBody: string;
  htmlBody: string;
  attachments: ColumnType<CaughtMailAttachmentRecord[], string | undefined, string>;
}
