/**
 * Running ngspice (Debian's package) in batch mode on many decks in one process. Test and
 * benchmark code only: the circuit core itself does no I/O.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseSpiceRaw } from '../spice';

export const NGSPICE = process.env.NGSPICE ?? '/usr/bin/ngspice';

/** Throw a clear error when ngspice is missing (so an oracle test fails, never skips). */
export function requireNgspice(): string {
	if (!existsSync(NGSPICE)) {
		throw new Error(
			`ngspice not found at ${NGSPICE}: the SPICE oracle needs it (Debian: apt-get install ngspice, or set NGSPICE=/path/to/ngspice)`
		);
	}
	return NGSPICE;
}

/** Run `.op` on each deck (netlist text ending in `.end`) in one ngspice process; node voltages per deck. */
export function runOperatingPoints(decks: readonly string[]): Map<string, number>[] {
	const bin = requireNgspice();
	const dir = mkdtempSync(join(tmpdir(), 'loom-spice-'));
	try {
		const control: string[] = ['* driver', '.control', 'set filetype=ascii'];
		decks.forEach((text, i) => {
			writeFileSync(join(dir, `c${i}.cir`), text);
			control.push(`source ${join(dir, `c${i}.cir`)}`, 'op', `write ${join(dir, `c${i}.raw`)} all`, 'destroy all', 'remcirc');
		});
		control.push('quit', '.endc', '.end', '');
		writeFileSync(join(dir, 'driver.cir'), control.join('\n'));
		execFileSync(bin, ['-b', join(dir, 'driver.cir')], { stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 256 * 1024 * 1024 });
		return decks.map((_, i) => {
			const raw = join(dir, `c${i}.raw`);
			if (!existsSync(raw)) throw new Error(`ngspice wrote no result for deck ${i}; see ${join(dir, `c${i}.cir`)}`);
			return parseSpiceRaw(readFileSync(raw, 'utf8'));
		});
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

/**
 * Time N operating points of one deck in one ngspice process: the mean time per solve from
 * ngspice's own analysis-time counter, runs of 1 and N subtracted so loading is left out.
 */
export function timeOperatingPoint(deck: string, repeats: number): { perSolveMs: number } {
	const bin = requireNgspice();
	const dir = mkdtempSync(join(tmpdir(), 'loom-spice-'));
	const file = join(dir, 'c.cir');
	writeFileSync(file, deck);
	const run = (n: number) => {
		const driver = ['* timing', '.control', `source ${file}`, `repeat ${n}`, 'op', 'destroy all', 'end', 'rusage time', 'quit', '.endc', '.end', ''].join('\n');
		writeFileSync(join(dir, 'driver.cir'), driver);
		const out = execFileSync(bin, ['-b', join(dir, 'driver.cir')], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 256 * 1024 * 1024 });
		const m = /Total analysis time \(seconds\) = ([\d.eE+-]+)/.exec(out);
		if (!m) throw new Error('ngspice printed no analysis time');
		return Number(m[1]);
	};
	try {
		const one = run(1);
		const many = run(repeats + 1);
		return { perSolveMs: (Math.max(0, many - one) / repeats) * 1000 };
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}
