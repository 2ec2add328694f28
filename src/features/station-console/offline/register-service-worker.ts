/**
 * Registers the console's service worker (public/console-sw.js) so the console opens without
 * network once loaded, and hands it the files this page already loaded before it took control.
 */
export function registerConsoleServiceWorker() {
  if (!('serviceWorker' in navigator)) return;
  navigator.serviceWorker
    .register('/console-sw.js', { scope: '/' })
    .then(() => navigator.serviceWorker.ready)
    .then((registration) => {
      const urls = performance
        .getEntriesByType('resource')
        .map((entry) => entry.name)
        .filter((name) => new URL(name).pathname.startsWith('/assets/'));
      registration.active?.postMessage({ type: 'keep', urls });
    })
    .catch(() => undefined); // Without it the console still works online and keeps its queue.
}
