// Writes the import/export fixtures in fixtures/ (committed; run again after the demo changes):
//   demo-harness.csv   the demo vehicle's part table and wire list, as the CSV export writes it
//   bad-wire-list.csv  a small invented lamp circuit with planted errors (see bad-wire-list.md)
//   manual-page.png    a page of our own drawing (an invented schematic) to trace over
// Usage: node --import tsx scripts/make-fixtures.ts   (needs /usr/bin/chromium for the PNG)
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { demoHarness } from '../src/lib/circuit/demo';
import { harnessSheetCsv } from '../src/lib/harness-io/wire-list';

const dir = new URL('../fixtures/', import.meta.url).pathname;

writeFileSync(join(dir, 'demo-harness.csv'), harnessSheetCsv(demoHarness()));

// Semicolons and decimal commas, as a spreadsheet in a decimal-comma locale saves them.
// Each planted error is listed, row by row, in bad-wire-list.md.
const bad = [
	'key;kind;label;location;terminals',
	'1;battery;Battery 12 V;engine-bay;+ -',
	'2;earth-point;Body earth, boot floor;boot;',
	'3;fuse;Fuse, lamps;engine-bay;',
	'4;switch;Lamp switch;dash;1 2',
	'5;lamp;Tail lamp, left;rear;',
	'6;lampe;Number plate lamp;rear;',
	'7;lamp;Stop lamp;boot-lid;',
	'',
	'from part;from terminal;to part;to terminal;colour;size;length;notes',
	'1;+;3;in;N;2;0,8;',
	'3;out;4;1;P;1;1,2;',
	'4;2;5;feed;R;0,75;3,5;',
	'5;earth;2;stud;B;0,75;0,4;',
	';2;5;feed;R/G;0,75;3,6;',
	'4;1;5;feed;RX;0,75;3,6;',
	'3;middle;5;feed;R;0,75;1;',
	'5;feed;4;1;R;thick;1;',
	'4;2;2;stud;B;1;250;',
	'6;feed;4;2;R;0,75;3;',
	'7;earth;2;stud;B;0,75;0,4;',
	'4;2;3;out;R;0,75;3;spare;surplus',
	'"4;1;3;in;R;1;1;'
];
writeFileSync(join(dir, 'bad-wire-list.csv'), bad.join('\r\n') + '\r\n');

// A manual page of our own: an invented lamp circuit in IEC 60617-like symbols, numbered key.
const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1000" height="1300" viewBox="0 0 1000 1300">
<rect width="1000" height="1300" fill="#f4efe2"/>
<g font-family="serif" fill="#2b2620">
<text x="80" y="90" font-size="34">Plate 7 — Lighting, invented tourer</text>
<text x="80" y="130" font-size="20">Key: 1 battery · 3 fuse · 4 lamp switch · 5 tail lamp · 2 body earth</text>
</g>
<g stroke="#2b2620" stroke-width="4" fill="none">
<rect x="120" y="260" width="160" height="90"/><line x1="170" y1="280" x2="170" y2="330"/><line x1="200" y1="295" x2="200" y2="315"/>
<line x1="280" y1="305" x2="420" y2="305"/>
<rect x="420" y="285" width="120" height="40"/><line x1="430" y1="305" x2="530" y2="305"/>
<line x1="540" y1="305" x2="680" y2="305"/>
<circle cx="700" cy="305" r="8"/><line x1="706" y1="300" x2="770" y2="270"/><circle cx="780" cy="305" r="8"/>
<line x1="788" y1="305" x2="860" y2="305"/><line x1="860" y1="305" x2="860" y2="600"/>
<circle cx="860" cy="650" r="50"/><line x1="825" y1="615" x2="895" y2="685"/><line x1="895" y1="615" x2="825" y2="685"/>
<line x1="860" y1="700" x2="860" y2="900"/>
<line x1="820" y1="900" x2="900" y2="900"/><line x1="835" y1="915" x2="885" y2="915"/><line x1="850" y1="930" x2="870" y2="930"/>
<line x1="120" y1="305" x2="80" y2="305"/><line x1="80" y1="305" x2="80" y2="900"/>
<line x1="40" y1="900" x2="120" y2="900"/><line x1="55" y1="915" x2="105" y2="915"/><line x1="70" y1="930" x2="90" y2="930"/>
</g>
<g font-family="sans-serif" font-size="24" fill="#2b2620">
<text x="175" y="240">1</text><text x="465" y="270">3</text><text x="730" y="250">4</text><text x="930" y="660">5</text><text x="880" y="970">2</text>
<text x="320" y="290">N</text><text x="590" y="290">P</text><text x="870" y="450">R</text><text x="870" y="800">B</text>
</g>
<text x="80" y="1240" font-family="serif" font-size="18" fill="#6b6254">Drawn for Loomwright's tests; not from any manual.</text>
</svg>`;
const work = mkdtempSync(join(tmpdir(), 'loom-page-'));
try {
	const svgPath = join(work, 'page.svg');
	writeFileSync(svgPath, svg);
	const png = join(dir, 'manual-page.png');
	execFileSync('/usr/bin/chromium', [
		'--headless',
		'--no-sandbox',
		'--disable-gpu',
		'--hide-scrollbars',
		`--user-data-dir=${join(work, 'profile')}`,
		'--window-size=1000,1300',
		`--screenshot=${png}`,
		`file://${svgPath}`
	], { stdio: 'ignore' });
	console.log(`manual-page.png ${statSync(png).size} bytes`);
} finally {
	rmSync(work, { recursive: true, force: true });
}
console.log('fixtures written to', dir);
