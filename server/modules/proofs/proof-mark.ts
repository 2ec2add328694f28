import sharp from 'sharp';

/**
 * The proof mark: the word PROOF repeated diagonally across the whole picture, drawn as strokes
 * (no font needed on the server), white over a dark outline so it shows on any background.
 */
const letters: Record<string, string[]> = {
  P: ['M0 7 L0 0 L3 0 L4 1 L4 2.5 L3 3.5 L0 3.5'],
  R: ['M0 7 L0 0 L3 0 L4 1 L4 2.5 L3 3.5 L0 3.5', 'M2 3.5 L4 7'],
  O: ['M1 0 L3 0 L4 1 L4 6 L3 7 L1 7 L0 6 L0 1 Z'],
  F: ['M4 0 L0 0 L0 7', 'M0 3.5 L3 3.5'],
};

function word(text: string, x: number, y: number) {
  return [...text]
    .map((letter, index) =>
      (letters[letter] ?? [])
        .map((d) => `<path transform="translate(${x + index * 6} ${y})" d="${d}"/>`)
        .join(''),
    )
    .join('');
}

export function proofMarkSvg(width: number, height: number): Buffer {
  const scale = Math.max(width, height) / 160;
  const rows: string[] = [];
  for (let row = -4; row < 16; row += 1) {
    for (let column = -2; column < 8; column += 1) {
      rows.push(word('PROOF', column * 38 + (row % 2) * 19, row * 16));
    }
  }
  const paths = rows.join('');
  return Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">` +
      `<g transform="scale(${scale}) rotate(-30 80 60)" fill="none" stroke-linecap="round" stroke-linejoin="round">` +
      `<g stroke="rgb(0,0,0)" stroke-opacity="0.35" stroke-width="1.6">${paths}</g>` +
      `<g stroke="rgb(255,255,255)" stroke-opacity="0.6" stroke-width="0.8">${paths}</g>` +
      `</g></svg>`,
  );
}

/** A web-sized proof of a preview: at most `longEdge` pixels, marked across, no metadata. */
export async function markedProof(preview: Buffer, longEdge = 1200): Promise<Buffer> {
  const resized = await sharp(preview)
    .resize({ width: longEdge, height: longEdge, fit: 'inside', withoutEnlargement: true })
    .toBuffer({ resolveWithObject: true });
  const { width, height } = resized.info;
  return sharp(resized.data)
    .composite([{ input: proofMarkSvg(width, height), top: 0, left: 0 }])
    .jpeg({ quality: 80 })
    .toBuffer();
}
