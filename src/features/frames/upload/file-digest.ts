/** Files above this are not digested in the browser: it would hold the whole file in memory. */
const MAX_DIGEST_BYTES = 256 * 1024 * 1024;

/** SHA-256 of a file as lower-case hex, or null where the page cannot compute it. */
export async function sha256Hex(file: Blob): Promise<string | null> {
  // crypto.subtle exists only on secure pages (https, localhost).
  if (!globalThis.crypto?.subtle || file.size > MAX_DIGEST_BYTES) return null;
  const digest = await crypto.subtle.digest('SHA-256', await file.arrayBuffer());
  return Array.from(new Uint8Array(digest), (byte) => byte.toString(16).padStart(2, '0')).join('');
}
