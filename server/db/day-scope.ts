import { sql } from 'kysely';

/**
 * Days on which the photographer runs at least one station: what a photographer may see.
 * For queries that select from shoot_days.
 */
export function staffedBy(photographerId: string) {
  return sql<boolean>`exists (select 1 from stations as staffed where staffed.day_id = shoot_days.id and staffed.photographer_id = ${photographerId})`;
}
