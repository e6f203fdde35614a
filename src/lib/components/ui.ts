// Shared class lists, so every button and input looks and behaves the same: at least 44 px tall
// (WCAG 2.2 §2.5.8 asks 24 px; 44 px is WCAG §2.5.5 AAA and fits gloved or oily fingers).
export const button =
	'inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-5 py-2.5 text-base font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60';
export const primary = `${button} bg-copper text-paper hover:bg-copper-dark`;
export const secondary = `${button} border-2 border-ink bg-paper text-ink hover:bg-paper-deep`;
export const danger = `${button} bg-fault text-white hover:bg-red-800`;
export const quiet = `${button} text-copper-dark underline-offset-4 hover:underline`;
export const input =
	'block min-h-12 w-full rounded-lg border-2 border-ink-soft bg-white px-3 py-2 text-base text-ink placeholder:text-ink-soft/70 aria-[invalid=true]:border-fault';
export const card = 'rounded-xl border-2 border-paper-deep bg-white p-5 shadow-sm sm:p-6';
