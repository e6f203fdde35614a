// The drawing board is an interactive canvas: rendering a large loom on the server only to
// hydrate it again costs seconds and shows nothing useful before the script runs.
export const ssr = false;
