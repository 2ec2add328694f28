import { randomBytes } from 'node:crypto';
import QRCode from 'qrcode';

const base32Alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ234567';

/**
 * An opaque pass token: 128 random bits as 26 base32 capitals. Every character is in the QR
 * alphanumeric set (ISO/IEC 18004), so the pass fits a version 2 symbol at level M (38
 * alphanumeric characters). It says nothing about the person.
 */
export function newPassToken(): string {
  const bytes = randomBytes(17); // 136 bits read; the first 130 become 26 characters
  let bits = '';
  for (const byte of bytes) bits += byte.toString(2).padStart(8, '0');
  let token = '';
  for (let index = 0; index < 26; index += 1) {
    token += base32Alphabet[parseInt(bits.slice(index * 5, index * 5 + 5), 2)];
  }
  return token;
}

export const passTokenPattern = /^[A-Z2-7]{26}$/;

/** The pass as a PNG: error correction M, alphanumeric mode, a 4-module quiet zone. */
export function passPng(token: string, scale = 8): Promise<Buffer> {
  return QRCode.toBuffer([{ data: token, mode: 'alphanumeric' }], {
    errorCorrectionLevel: 'M',
    margin: 4,
    scale,
    type: 'png',
    color: { dark: '#1b2228ff', light: '#ffffffff' },
  });
}
