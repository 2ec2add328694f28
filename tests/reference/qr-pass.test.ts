import { describe, expect, it } from 'vitest';
import { decodePng } from './decode-png';
import { newPassToken, passPng, passTokenPattern } from '../../server/modules/booking/pass';

// ISO/IEC 18004: the QR alphanumeric set (45 symbols).
const alphanumeric = /^[0-9A-Z $%*+\-./:]+$/;

describe('the pass (ISO/IEC 18004)', () => {
  it('is 26 characters from the alphanumeric set, random each time, holding no personal data', () => {
    const tokens = new Set(Array.from({ length: 1000 }, () => newPassToken()));
    expect(tokens.size).toBe(1000);
    for (const token of tokens) {
      expect(token).toMatch(passTokenPattern);
      expect(token).toMatch(alphanumeric);
    }
  });

  it('decodes with jsqr to exactly the token, as a version 2 symbol (25 modules; 2-M holds 38 alphanumeric)', async () => {
    for (let round = 0; round < 20; round += 1) {
      const token = newPassToken();
      const scale = 8;
      const { code, image } = decodePng(await passPng(token, scale));
      expect(code?.data).toBe(token);
      // 4v + 17 modules plus a 4-module quiet zone each side.
      const modules = image.width / scale - 8;
      expect(modules).toBe(4 * 2 + 17);
      expect(code?.version).toBe(2);
    }
  });
});
