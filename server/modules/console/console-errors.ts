import { AppError } from '../../lib/errors';

export const timeIn = (zone: string, at: Date) =>
  new Intl.DateTimeFormat('en-GB', { timeZone: zone, hour: '2-digit', minute: '2-digit' }).format(
    at,
  );

/** Maps the database's own refusals (unique indexes) to answers the photographer can act on. */
export function explainConstraint(constraint: string | undefined): AppError | null {
  switch (constraint) {
    case 'check_ins_one_per_person_day':
    case 'check_ins_one_per_booking':
      return new AppError('already_checked_in', 409, 'This sitter is already checked in today.');
    case 'sittings_one_open_per_station':
      return new AppError(
        'station_busy',
        409,
        'A sitting is still open on this station. Finish it first.',
      );
    case 'no_shows_one_per_booking':
      return new AppError('already_no_show', 409, 'This sitter is already marked no-show.');
    case 'people_client_email_unique':
      return new AppError(
        'email_on_roster',
        409,
        'Someone on the roster already has this e-mail. Search for them by name instead.',
      );
    case 'check_ins_pkey':
    case 'sittings_pkey':
    case 'no_shows_pkey':
    case 'people_pkey':
    case 'sittings_slate_token_key':
      return new AppError('duplicate_id', 409, 'This change reused an id. Reload the console.');
    default:
      return null;
  }
}

export function pgError(error: unknown): { code?: string; constraint?: string } {
  return typeof error === 'object' && error !== null ? error : {};
}
