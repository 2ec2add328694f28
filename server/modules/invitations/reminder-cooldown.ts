/**
 * Who a reminder may reach now, and who waits out the cool-down since their last one: the
 * one rule of booking reminders and proof reminders alike. Pure, so both count the same way.
 */
export function splitByCooldown(
  personIds: readonly string[],
  lastRemindedAt: ReadonlyMap<string, Date>,
  now: number,
  cooldownMs: number,
): { due: string[]; coolingDown: number; nextAt: Date | null } {
  const due: string[] = [];
  let nextAt: number | null = null;
  for (const personId of personIds) {
    const reminded = lastRemindedAt.get(personId);
    const freeAt = reminded ? reminded.getTime() + cooldownMs : 0;
    if (freeAt <= now) due.push(personId);
    else nextAt = nextAt === null ? freeAt : Math.min(nextAt, freeAt);
  }
  return {
    due,
    coolingDown: personIds.length - due.length,
    nextAt: nextAt === null ? null : new Date(nextAt),
  };
}
