/* global self, caches, fetch, URL, Response */
/*
 * Service worker for the station console: the app opens without network once it has been
 * loaded. Pages: network first, the stored page when offline. Built assets (hashed names,
 * never change): stored on first use. The API is never cached here: the console keeps its
 * own copy of the day and its waiting changes in IndexedDB, and must never be shown stale
 * answers as if they were fresh.
 */
const cacheName = 'likeness-console-v1';
const shell = '/index.html';

self.addEventListener('install', (event) => {
  event.waitUntil(
    caches
      .open(cacheName)
      .then((cache) => cache.addAll([shell, '/manifest.webmanifest', '/icons/console.svg']))
      .then(() => self.skipWaiting()),
  );
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((names) =>
        Promise.all(
          names
            .filter((name) => name.startsWith('likeness-console-') && name !== cacheName)
            .map((name) => caches.delete(name)),
        ),
      )
      .then(() => self.clients.claim()),
  );
});

// The page lists the files it loaded before this worker took control, so they are kept too.
self.addEventListener('message', (event) => {
  const data = event.data;
  if (!data || data.type !== 'keep' || !Array.isArray(data.urls)) return;
  const urls = data.urls.filter((url) => {
    try {
      const parsed = new URL(url, self.location.origin);
      return parsed.origin === self.location.origin && parsed.pathname.startsWith('/assets/');
    } catch {
      return false;
    }
  });
  event.waitUntil(
    caches
      .open(cacheName)
      .then((cache) => cache.addAll(urls))
      .catch(() => undefined),
  );
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  if (request.method !== 'GET') return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin || url.pathname.startsWith('/api/')) return;

  if (request.mode === 'navigate') {
    event.respondWith(
      fetch(request)
        .then((response) => {
          if (response.ok) {
            const copy = response.clone();
            void caches.open(cacheName).then((cache) => cache.put(shell, copy));
          }
          return response;
        })
        .catch(() => caches.match(shell).then((cached) => cached ?? Response.error())),
    );
    return;
  }

  if (url.pathname.startsWith('/assets/') || url.pathname.startsWith('/icons/')) {
    event.respondWith(
      caches.match(request).then(
        (cached) =>
          cached ??
          fetch(request).then((response) => {
            if (response.ok) {
              const copy = response.clone();
              void caches.open(cacheName).then((cache) => cache.put(request, copy));
            }
            return response;
          }),
      ),
    );
  }
});
