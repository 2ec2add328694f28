import { useEffect, useRef, useState } from 'react';
import { prepareZXingModule, readBarcodes } from 'zxing-wasm/reader';
import wasmUrl from 'zxing-wasm/reader/zxing_reader.wasm?url';

// The decoder's .wasm is bundled with the app (and cached for offline use), never fetched from
// a CDN: venue networks and offline tablets could not reach one.
prepareZXingModule({
  overrides: {
    locateFile: (file: string, prefix: string) =>
      file.endsWith('.wasm') ? wasmUrl : prefix + file,
  },
});

/** How often a camera frame is decoded: often enough to feel instant, light on the battery. */
const scanIntervalMs = 200;
/**
 * A pass held in view is read once: the same code is offered again only after it has been out
 * of view this long (the pause restarts each time it is seen).
 */
const sameCodePauseMs = 3000;

/**
 * Reads a pass with the tablet's rear camera (facingMode "environment") and zxing-wasm. Nothing here
 * flashes: the video is shown as it is, with a still frame drawn around the scan area.
 */
export function PassScanner({ onCode }: { onCode: (text: string) => void }) {
  const video = useRef<HTMLVideoElement>(null);
  // Without mediaDevices (plain http on a LAN address, old browsers) there is no camera at all.
  const [problem, setProblem] = useState<string | null>(() =>
    navigator.mediaDevices ? null : 'This browser offers no camera here. Search by name instead.',
  );
  const onCodeRef = useRef(onCode);
  useEffect(() => {
    onCodeRef.current = onCode;
  }, [onCode]);

  useEffect(() => {
    let stream: MediaStream | null = null;
    let timer: ReturnType<typeof setInterval> | undefined;
    let stopped = false;
    const canvas = document.createElement('canvas');
    const context = canvas.getContext('2d', { willReadFrequently: true });
    let last = { text: '', at: 0 };
    let busy = false;

    const scan = async () => {
      const element = video.current;
      if (busy || !element || !context || element.readyState < 2 || element.videoWidth === 0)
        return;
      busy = true;
      try {
        canvas.width = element.videoWidth;
        canvas.height = element.videoHeight;
        context.drawImage(element, 0, 0);
        const image = context.getImageData(0, 0, canvas.width, canvas.height);
        const [code] = await readBarcodes(image, { formats: ['QRCode'], maxNumberOfSymbols: 1 });
        if (!code?.isValid || !code.text) return;
        const now = Date.now();
        const repeat = code.text === last.text && now - last.at < sameCodePauseMs;
        last = { text: code.text, at: now };
        if (!repeat) onCodeRef.current(code.text);
      } finally {
        busy = false;
      }
    };

    navigator.mediaDevices
      ?.getUserMedia({ video: { facingMode: { ideal: 'environment' } }, audio: false })
      .then(async (media) => {
        if (stopped) {
          media.getTracks().forEach((track) => track.stop());
          return;
        }
        stream = media;
        if (video.current) {
          video.current.srcObject = media;
          await video.current.play().catch(() => undefined);
        }
        timer = setInterval(() => void scan(), scanIntervalMs);
      })
      .catch(() =>
        setProblem('The camera is not available. Allow camera access, or search by name instead.'),
      );
    return () => {
      stopped = true;
      clearInterval(timer);
      stream?.getTracks().forEach((track) => track.stop());
    };
  }, []);

  return (
    <div className="flex flex-col gap-2">
      {problem ? (
        <p role="alert" className="text-base font-medium text-danger-600">
          {problem}
        </p>
      ) : null}
      <div className="relative overflow-hidden rounded-card bg-ink">
        <video
          ref={video}
          muted
          playsInline
          aria-label="Camera view for scanning a pass"
          className="aspect-[4/3] w-full object-cover"
        />
        <div
          aria-hidden
          className="pointer-events-none absolute inset-[15%] rounded-card border-4 border-paper-raised/80"
        />
      </div>
      <p className="text-base text-ink-muted">Hold the pass inside the frame, about 20 cm away.</p>
    </div>
  );
}
