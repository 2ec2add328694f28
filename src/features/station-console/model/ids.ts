const base32Alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ234567';

/** Ids are made on the tablet so that work recorded offline can be shown and undone at once. */
export const newId = (): string => crypto.randomUUID();

/** A slate token like a pass token: 26 base32 capitals (130 random bits), QR alphanumeric mode. */
export function newSlateToken(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(26));
  return Array.from(bytes, (byte) => base32Alphabet[byte % 32]).join('');
}

/** SHA-256 hex, to match a scanned pass against the snapshot's pass hashes. */
export async function sha256Hex(text: string): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', new TextEncoder().encode(text));
  return Array.from(new Uint8Array(digest), (byte) => byte.toString(16).padStart(2, '0')).join('');
}
