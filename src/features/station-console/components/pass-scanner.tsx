import jsQR from 'jsqr';
import { useEffect, useRef, useState } from 'react';

/** How often a camera frame is decoded: often enough to feel instant, light on the battery. */
const scanIntervalMs = 200;
/** The same pass held in view is read once, not five times a second. */
const sameCodePauseMs = 4000;

/**
 * Reads a pass with the tablet's rear camera (facingMode "environment") and jsQR. Nothing here
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

    const scan = () => {
      const element = video.current;
      if (!element || !context || element.readyState < 2 || element.videoWidth === 0) return;
      canvas.width = element.videoWidth;
      canvas.height = element.videoHeight;
      context.drawImage(element, 0, 0);
      const image = context.getImageData(0, 0, canvas.width, canvas.height);
      const code = jsQR(image.data, image.width, image.height, { inversionAttempts: 'dontInvert' });
      if (!code?.data) return;
      const now = Date.now();
      if (code.data === last.text && now - last.at < sameCodePauseMs) return;
      last = { text: code.data, at: now };
      onCodeRef.current(code.data);
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
        timer = setInterval(scan, scanIntervalMs);
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
