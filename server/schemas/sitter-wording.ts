/**
 * Words shown about a sitter in more than one place (console, slate, day sheet, schedule CSV,
 * retouch queue), kept here so every screen and file says the same thing.
 */
export const NO_FLASH_WORDING = 'No flash: continuous light for this sitter';

/** Mail outcomes as people read them; the stored values stay queued / sent / failed. */
export const mailStatusLabels = {
  queued: 'Waiting',
  sent: 'Sent',
  failed: 'Failed',
} as const;
