import { useEffect } from 'react';

/** Keeps the tablet's screen on while the console is open, where the browser allows it. */
export function useWakeLock() {
  useEffect(() => {
    if (!('wakeLock' in navigator)) return;
    let lock: WakeLockSentinel | null = null;
    let released = false;
    const request = () => {
      if (document.visibilityState !== 'visible') return;
      navigator.wakeLock.request('screen').then(
        (sentinel) => {
          if (released) void sentinel.release();
          else lock = sentinel;
        },
        () => undefined, // Refused (battery saver, no user gesture yet): the screen may dim.
      );
    };
    request();
    // The browser drops the lock when the page is hidden; take it again on return.
    document.addEventListener('visibilitychange', request);
    return () => {
      released = true;
      document.removeEventListener('visibilitychange', request);
      void lock?.release();
    };
  }, []);
}
