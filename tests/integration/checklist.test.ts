// The probe checklist over HTTP: a diagnosis started on the demo harness through the API, its
// PDF download read back with pdf-lib (src/lib/diagnosis/testing/pdf-text.ts) and its print page,
// both with the plan's steps, and the access rules of a diagnosis (401 without an account, 404
// to another account and for an id that does not exist).
import { PDFDocument } from 'pdf-lib';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from '../../src/lib/circuit/demo';
import { pdfText, stepHeadings } from '../../src/lib/diagnosis/testing/pdf-text';
import { api, baseUrl, signedInAccount, type SignedIn } from './helpers';

let owner: SignedIn;
let stranger: SignedIn;
let diagnosisId: string;
let firstProbe: string;
let predicted: number;

const gaugesLow = [
	{ part: 'fuel-gauge', mark: 'reads-low' },
	{ part: 'temp-gauge', mark: 'reads-low' }
];

async function pdf(id: string, cookie: string | null, query = '') {
	const res = await fetch(`${baseUrl()}/api/diagnoses/${id}/checklist.pdf${query}`, { headers: cookie ? { cookie } : {} });
	return { res, bytes: new Uint8Array(await res.arrayBuffer()) };
}

async function planSteps(id: string): Promise<number> {
	const r = await api('GET', `/api/diagnoses/${id}`, owner.cookie);
	expect(r.status).toBe(200);
	return r.body.plan.plan.steps.length;
}

beforeAll(async () => {
	owner = await signedInAccount('Checklist Owner');
	stranger = await signedInAccount('Checklist Stranger');
	const v = await api('POST', '/api/vehicles', owner.cookie, { name: 'Checklist Ostrimmel', make: 'Ombrith & Vessick', model: 'Ostrimmel Tourer', year: '1962', systemVoltage: 12, earthPolarity: 'positive' });
	expect(v.status).toBe(201);
	const d = await api('POST', '/api/diagrams', owner.cookie, { vehicleId: v.body.vehicle.id, title: 'Complete harness', document: demoHarness() });
	expect(d.status).toBe(201);
	const started = await api('POST', `/api/diagrams/${d.body.diagram.id}/diagnoses`, owner.cookie, { revision: 1, marks: gaugesLow });
	expect(started.status, JSON.stringify(started.body)).toBe(201);
	diagnosisId = started.body.diagnosis.id;
	firstProbe = started.body.plan.plan.steps[0].probe;
	// The reading the instrument stabilizer's low output predicts at the first step, from the
	// stateless plan of the same marks (the diagnosis's page data names the probes only).
	const stateless = await api('POST', `/api/diagrams/${d.body.diagram.id}/probe-plan`, owner.cookie, { marks: gaugesLow });
	expect(stateless.status).toBe(200);
	const step = stateless.body.plan.steps[0];
	expect(step.probe).toBe(firstProbe);
	predicted = step.expected.find((e: { suspect: string }) => e.suspect === 'stabilizer:low:stabilizer').reading;
}, 60_000);

describe('GET /api/diagnoses/[id]/checklist.pdf', () => {
	it('downloads a PDF with a step heading for every step of the plan, and the cautions', async () => {
		const { res, bytes } = await pdf(diagnosisId, owner.cookie);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/pdf');
		// RFC 6266: an attachment with a plain ASCII file name naming the vehicle.
		expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="checklist-checklist-ostrimmel-\d{4}-\d\d-\d\d-[0-9a-f]{8}\.pdf"$/);
		// ISO 32000-1 §7.5.2: a PDF file begins with "%PDF-".
		expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-');
		const text = await pdfText(bytes);
		const steps = await planSteps(diagnosisId);
		expect(steps).toBeGreaterThan(3);
		expect(stepHeadings(text)).toEqual(Array.from({ length: steps }, (_, i) => i + 1));
		const runs = text.runs.flat();
		expect(runs).toContain('CAUTIONS: read before you start');
		expect(runs).toContain('Battery gases and short circuits');
		// The demo has breaker-point ignition and every step of this plan is powered (TRADE.md).
		expect(runs).toContain('Ignition left on (breaker-point coil)');
		expect(runs.join(' ')).toMatch(/local codes/);
		expect(runs).toContain(`Page 1 of ${text.pages}`);
	});

	it('writes its dates as the reader does: the browser’s language and time zone, the page and the PDF alike', async () => {
		// CLDR medium dates through Intl: de-DE "dd.MM.y", English (no Accept-Language) "MMM d, y".
		const german = { cookie: `${owner.cookie}; loom-tz=Europe%2FBerlin`, 'accept-language': 'de-DE,de;q=0.9' };
		const html = await (await fetch(`${baseUrl()}/diagnoses/${diagnosisId}/checklist`, { headers: { ...german, accept: 'text/html' } })).text();
		expect(html.replace(/<!--.*?-->/g, '')).toMatch(/started \d\d\.\d\d\.\d{4}; printed \d\d\.\d\d\.\d{4}/);
		const res = await fetch(`${baseUrl()}/api/diagnoses/${diagnosisId}/checklist.pdf`, { headers: german });
		const runs = (await pdfText(new Uint8Array(await res.arrayBuffer()))).runs.flat().join(' ');
		expect(runs).toMatch(/\d\d\.\d\d\.\d{4}/);
		const english = (await pdfText((await pdf(diagnosisId, owner.cookie)).bytes)).runs.flat().join(' ');
		expect(english).toMatch(/[A-Z][a-z]{2} \d{1,2}, \d{4}/);
		expect(english).not.toMatch(/\d\d\.\d\d\.\d{4}/);
	});

	it('makes Letter pages on ?paper=letter (612 × 792 pt)', async () => {
		const { res, bytes } = await pdf(diagnosisId, owner.cookie, '?paper=letter');
		expect(res.status).toBe(200);
		expect((await PDFDocument.load(bytes)).getPage(0).getSize()).toEqual({ width: 612, height: 792 });
	});

	it('follows the readings: after one, the plan is shorter and the reading is printed', async () => {
		const before = await planSteps(diagnosisId);
		const stored = await api('POST', `/api/diagnoses/${diagnosisId}/readings`, owner.cookie, {
			readings: [{ clientId: crypto.randomUUID(), probe: firstProbe, outcome: 'value', value: predicted, unit: 'V', takenAt: new Date().toISOString() }]
		});
		expect(stored.status, JSON.stringify(stored.body)).toBeLessThan(300);
		const after = await planSteps(diagnosisId);
		expect(after).toBeLessThan(before);
		const text = await pdfText((await pdf(diagnosisId, owner.cookie)).bytes);
		expect(stepHeadings(text)).toHaveLength(after);
		const runs = text.runs.flat();
		expect(runs).toContain('Readings taken so far');
		expect(runs).toContain(`${(Math.abs(predicted) < 0.005 ? 0 : predicted).toFixed(2)} V`);
	});

	it('answers 401 without an account, 404 to another account and for a diagnosis that does not exist', async () => {
		expect((await pdf(diagnosisId, null)).res.status).toBe(401);
		expect((await pdf(diagnosisId, stranger.cookie)).res.status).toBe(404);
		expect((await pdf(crypto.randomUUID(), owner.cookie)).res.status).toBe(404);
		expect((await pdf('not-an-id', owner.cookie)).res.status).toBe(404);
	});
});

describe('the print page /diagnoses/[id]/checklist', () => {
	it('renders on the server with as many steps as the PDF, the cautions, and no script-made content', async () => {
		const res = await fetch(`${baseUrl()}/diagnoses/${diagnosisId}/checklist`, { headers: { cookie: owner.cookie, accept: 'text/html' } });
		expect(res.status).toBe(200);
		const html = await res.text();
		const pageSteps = html.match(/<li[^>]*data-step="\d+"/g)?.length ?? 0;
		const pdfSteps = stepHeadings(await pdfText((await pdf(diagnosisId, owner.cookie)).bytes)).length;
		expect(pageSteps).toBe(pdfSteps);
		expect(pageSteps).toBe(await planSteps(diagnosisId));
		expect(html).toContain('Cautions: read before you start');
		expect(html).toContain('data-caution="battery"');
		// The reading taken in the test above is on the page too.
		expect(html).toContain('Readings taken so far');
		// The region drawing travels inside the page, needing no request (offline after one visit).
		expect(html).toMatch(/<img src="data:image\/svg\+xml;base64,/);
		expect(html).toMatch(/\/api\/diagnoses\/[0-9a-f-]+\/checklist\.pdf/);
	});

	it('sends a visitor without an account to sign in, and shows another account nothing', async () => {
		const anon = await fetch(`${baseUrl()}/diagnoses/${diagnosisId}/checklist`, { redirect: 'manual', headers: { accept: 'text/html' } });
		expect(anon.status).toBe(303);
		expect(anon.headers.get('location')).toMatch(/^\/signin\?next=/);
		const other = await fetch(`${baseUrl()}/diagnoses/${diagnosisId}/checklist`, { headers: { cookie: stranger.cookie, accept: 'text/html' } });
		expect(other.status).toBe(404);
	});

	it('prints a struck reading and a conclusion as words spaced apart from what comes before them', async () => {
		const d = await api('GET', `/api/diagnoses/${diagnosisId}`, owner.cookie);
		const diagramId = d.body.diagnosis.diagramId;
		const started = await api('POST', `/api/diagrams/${diagramId}/diagnoses`, owner.cookie, { revision: 1, marks: gaugesLow });
		expect(started.status, JSON.stringify(started.body)).toBe(201);
		const id = started.body.diagnosis.id;
		const probe = started.body.plan.plan.steps[0].probe;
		const r = await api('POST', `/api/diagnoses/${id}/readings`, owner.cookie, {
			readings: [{ clientId: crypto.randomUUID(), probe, outcome: 'value', value: predicted, unit: 'V', takenAt: new Date().toISOString() }]
		});
		expect(r.status, JSON.stringify(r.body)).toBeLessThan(300);
		expect((await api('DELETE', `/api/diagnoses/${id}/readings/${r.body.readings[0].id}`, owner.cookie)).status).toBeLessThan(300);
		const now = await api('GET', `/api/diagnoses/${id}`, owner.cookie);
		const done = await api('POST', `/api/diagnoses/${id}/conclude`, owner.cookie, { version: now.body.diagnosis.version, conclusion: 'Stabilizer replaced.' });
		expect(done.status, JSON.stringify(done.body)).toBe(200);
		const html = await (await fetch(`${baseUrl()}/diagnoses/${id}/checklist`, { headers: { cookie: owner.cookie, accept: 'text/html' } })).text();
		// Svelte's hydration markers are not text; what is left reads as the printed sentence.
		const text = html.replace(/<!--.*?-->/g, '');
		expect(text).toMatch(/[^\s>] Concluded: Stabilizer replaced\./);
		expect(text).toMatch(/[^\s>] <span[^>]*>\(struck out: not used\)/);
	});
});
