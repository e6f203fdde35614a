/// <reference types="@sveltejs/kit" />
/// <reference no-default-lib="true"/>
/// <reference lib="esnext" />
/// <reference lib="webworker" />
// Offline in the garage: the app's own files are cached when it is installed, and a diagnosis
// (its page, its checklist, its API data and PDF) is cached each time it is fetched, so an open
// diagnosis, its checklist and its reading entry still load with no network. Pages and data are
// fetched from the network first, so a working connection always shows the latest; the cache
// answers only when the network does not. Readings typed offline are queued by the page
// (src/lib/diagnosis/queue.ts), not here: nothing but GET passes through this worker's cache.
import { build, files, version } from '$service-worker';

const sw = self as unknown as ServiceWorkerGlobalScope;
const ASSETS = `loomwright-assets-${version}`;
const PAGES = 'loomwright-diagnoses';
const assets = new Set([...build, ...files]);

/** The diagnosis pages and data kept for offline use. */
const OFFLINE = [/^\/diagnoses\/[0-9a-f-]{36}(\/checklist)?\/?(__data\.json)?$/, /^\/api\/diagnoses\/[0-9a-f-]{36}(\/checklist\.pdf)?$/];

sw.addEventListener('install', (event) => {
	event.waitUntil(
		caches
			.open(ASSETS)
			.then((cache) => cache.addAll([...assets]))
			.then(() => sw.skipWaiting())
	);
});

sw.addEventListener('activate', (event) => {
	event.waitUntil(
		(async () => {
			for (const key of await caches.keys()) if (key.startsWith('loomwright-assets-') && key !== ASSETS) await caches.delete(key);
			await sw.clients.claim();
		})()
	);
});

async function networkFirst(request: Request): Promise<Response> {
	const cache = await caches.open(PAGES);
	try {
		const response = await fetch(request);
		if (response.ok && response.type === 'basic') await cache.put(request, response.clone());
		return response;
	} catch (e) {
		const cached = await cache.match(request);
		if (cached) return cached;
		throw e;
	}
}

// A diagnosis page asks for itself, its checklist and its data to be kept (the first visit's
// own request came before this worker was in charge, so it would not be cached otherwise).
sw.addEventListener('message', (event) => {
	const data = event.data as { type?: string; urls?: unknown } | null;
	if (data?.type !== 'keep' || !Array.isArray(data.urls)) return;
	const urls = data.urls.filter((u): u is string => typeof u === 'string' && OFFLINE.some((re) => re.test(u)));
	event.waitUntil(Promise.all(urls.map((u) => networkFirst(new Request(u, { credentials: 'same-origin' })).catch(() => undefined))));
});

sw.addEventListener('fetch', (event) => {
	const { request } = event;
	const url = new URL(request.url);
	if (url.origin !== sw.location.origin) return;
	// Signing out: forget the cached diagnoses, they belong to the account.
	if (request.method === 'POST' && url.pathname === '/signout') {
		event.waitUntil(caches.delete(PAGES));
		return;
	}
	if (request.method !== 'GET') return;
	// The app's files never change under one name (Vite puts a hash in it): cache first. Chunks
	// loaded later (the planner's worker, say) are kept as they are first fetched.
	if (assets.has(url.pathname) || url.pathname.startsWith('/_app/immutable/')) {
		event.respondWith(
			caches.match(request).then(
				(hit) =>
					hit ??
					fetch(request).then(async (response) => {
						if (response.ok) await (await caches.open(ASSETS)).put(request, response.clone());
						return response;
					})
			)
		);
		return;
	}
	if (OFFLINE.some((re) => re.test(url.pathname))) event.respondWith(networkFirst(request));
});
