import { createHmac, timingSafeEqual } from 'node:crypto';

/**
 * Signed, expiring proof-image URLs: HMAC-SHA-256 (RFC 2104) over the frame, the person it is
 * shown to and the expiry, so a copied link stops working and names only that one frame.
 */
export function createProofUrls(settings: { secret: string; ttlMs: number }) {
  const signature = (frameId: string, personId: string, expires: number) =>
    createHmac('sha256', settings.secret)
      .update(`${frameId}.${personId}.${expires}`)
      .digest('base64url');

  return {
    urlFor(frameId: string, personId: string, now: number): string {
      const expires = Math.floor((now + settings.ttlMs) / 1000);
      const query = new URLSearchParams({
        p: personId,
        e: String(expires),
        s: signature(frameId, personId, expires),
      });
      return `/api/proof-images/${frameId}?${query.toString()}`;
    },

    /** Whether a URL's signature is ours and it has not expired. */
    verify(
      input: { frameId: string; personId: string; expires: number; sig: string },
      now: number,
    ) {
      if (input.expires * 1000 < now) return false;
      const expected = Buffer.from(signature(input.frameId, input.personId, input.expires));
      const given = Buffer.from(input.sig);
      return given.length === expected.length && timingSafeEqual(given, expected);
    },
  };
}

export type ProofUrls = ReturnType<typeof createProofUrls>;
