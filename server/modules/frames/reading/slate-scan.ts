import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { prepareZXingModule, readBarcodes } from 'zxing-wasm/reader';
import { slateTokenPattern } from '../../../schemas/console';

let ready: Promise<unknown> | null = null;

/**
 * zxing-wasm fetches its .wasm from a CDN unless told otherwise; that fails offline and here,
 * so the binary is read from node_modules once per process.
 */
function prepareDecoder(): Promise<unknown> {
  ready ??= (async () => {
    const require = createRequire(import.meta.url);
    const wasmPath = require.resolve('zxing-wasm/reader/zxing_reader.wasm');
    const wasmBinary = (await readFile(wasmPath)).buffer;
    return prepareZXingModule({
      overrides: { wasmBinary: wasmBinary as ArrayBuffer },
      fireImmediately: true,
    });
  })();
  return ready;
}

/** Slate tokens in a preview (JPEG bytes): QR codes whose text has the slate's form. */
export async function findSlateTokens(previewJpeg: Buffer): Promise<string[]> {
  await prepareDecoder();
  const results = await readBarcodes(new Uint8Array(previewJpeg), {
    formats: ['QRCode'],
    tryHarder: true,
    maxNumberOfSymbols: 4,
  });
  const tokens = results
    .filter((result) => result.isValid)
    .map((result) => result.text.trim())
    .filter((text) => slateTokenPattern.test(text));
  return [...new Set(tokens)];
}
