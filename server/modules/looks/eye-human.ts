import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type * as TfCore from '@tensorflow/tfjs-core';
import type { Config, FaceResult, Human } from '@vladmandic/human';

/**
 * @vladmandic/human on the tfjs wasm backend, with every file it needs read from node_modules:
 * nothing is downloaded at run time. Two workarounds (see STACK-NOTES, "Faces and eyes"): the
 * package's exports map has no entry Node picks for the wasm build, so its dist file is required
 * by path; and the models are `file://` URLs, which Node's fetch refuses, so tfjs gets a load
 * router whose fetch reads them from disk.
 */
const require = createRequire(import.meta.url);
// Resolving (not loading) the main entries finds the package folders wherever npm put them.
const humanFolder = path.dirname(path.dirname(require.resolve('@vladmandic/human')));
const wasmFolder = path.dirname(require.resolve('@tensorflow/tfjs-backend-wasm'));

/** Faces below this detector score are not reported at all by human. */
export const DETECTOR_MIN_CONFIDENCE = 0.3;

const config: Partial<Config> = {
  backend: 'wasm',
  // setWasmPaths takes a prefix; a folder path with a trailing separator is read with fs.
  wasmPath: `${wasmFolder}${path.sep}`,
  modelBasePath: pathToFileURL(path.join(humanFolder, 'models') + path.sep).href,
  debug: false,
  warmup: 'none',
  // Each call is a different photograph: no reuse of boxes from the previous call.
  cacheSensitivity: 0,
  filter: { enabled: false },
  face: {
    enabled: true,
    detector: {
      rotation: true,
      maxDetected: 8,
      minConfidence: DETECTOR_MIN_CONFIDENCE,
      skipFrames: 0,
      skipTime: 0,
      return: false,
    },
    mesh: { enabled: true },
    iris: { enabled: true, skipFrames: 0, skipTime: 0 },
    attention: { enabled: false },
    description: { enabled: false },
    emotion: { enabled: false },
    antispoof: { enabled: false },
    liveness: { enabled: false },
  },
  body: { enabled: false },
  hand: { enabled: false },
  object: { enabled: false },
  gesture: { enabled: false },
  segmentation: { enabled: false },
};

/** An RGB image, 3 bytes a pixel, row after row. */
export interface RgbImage {
  data: Buffer;
  width: number;
  height: number;
}

export interface FaceModel {
  detect(image: RgbImage): Promise<FaceResult[]>;
  close(): Promise<void>;
}

/** The fetch tfjs calls for the model files: `file://` only, since that is all it is given. */
async function readFileUrl(input: RequestInfo | URL): Promise<Response> {
  const url = input instanceof Request ? input.url : String(input);
  return new Response(await readFile(fileURLToPath(url)));
}

let fileRouterRegistered = false;

export async function loadFaceModel(): Promise<FaceModel> {
  const { Human: HumanClass } = require(path.join(humanFolder, 'dist', 'human.node-wasm.js')) as {
    Human: new (config: Partial<Config>) => Human;
  };
  const human = new HumanClass(config);
  const tf = human.tf as typeof TfCore;
  if (!fileRouterRegistered) {
    // tfjs asks each router in turn; one that answers null leaves the URL to the next.
    tf.io.registerLoadRouter((url) =>
      typeof url === 'string' && url.startsWith('file://')
        ? tf.io.http(url, { fetchFunc: readFileUrl })
        : (null as unknown as TfCore.io.IOHandler),
    );
    fileRouterRegistered = true;
  }
  await human.load();
  await tf.ready();
  if (tf.getBackend() !== 'wasm')
    throw new Error(`face model runs on ${tf.getBackend()}, not wasm`);
  return {
    async detect(image) {
      const input = tf.tensor3d(
        new Uint8Array(image.data),
        [image.height, image.width, 3],
        'int32',
      );
      try {
        const result = await human.detect(input);
        if (result.error) throw new Error(`face detection failed: ${result.error}`);
        return result.face;
      } finally {
        tf.dispose(input);
      }
    },
    async close() {
      human.models.reset();
      tf.disposeVariables();
    },
  };
}
