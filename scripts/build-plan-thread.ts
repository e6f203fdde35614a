// Builds the planning thread (src/lib/server/planning/thread.ts) into one file beside the app
// server's entry, where pool.ts finds it. Run after `vite build` (npm run build): SvelteKit's
// adapter bundles only what the server imports, and a worker thread is loaded by its path.
import { build } from 'vite';

const outDir = process.env.LOOM_BUILD_DIR ?? 'build';
await build({
	configFile: false,
	logLevel: 'warn',
	build: {
		ssr: 'src/lib/server/planning/thread.ts',
		outDir,
		emptyOutDir: false,
		target: 'node20',
		sourcemap: true,
		rollupOptions: { output: { entryFileNames: 'plan-thread.js', format: 'es' } }
	},
	// Self-contained: the thread carries the circuit core and what it uses.
	ssr: { noExternal: true }
});
console.log(`planning thread: ${outDir}/plan-thread.js`);
