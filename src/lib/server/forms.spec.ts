import { describe, expect, it } from 'vitest';
import { diagramSave, signInForm, signUpForm, vehicleFields, vehiclePatch } from './forms';
import { fieldErrors, fromZod } from './issues';

function errorsOf(schema: { safeParse: (v: unknown) => { success: boolean; error?: unknown } }, value: unknown) {
	const r = schema.safeParse(value) as { success: boolean; error?: import('zod').ZodError };
	return r.success ? {} : fieldErrors(fromZod(r.error!));
}

describe('vehicleFields', () => {
	const good = { name: 'The Ostrimmel', make: 'Ombrith & Vessick', model: 'Ostrimmel Tourer', year: '1962', systemVoltage: '12', earthPolarity: 'positive', notes: '' };

	it('accepts form strings and turns the voltage into a number', () => {
		const r = vehicleFields.parse(good);
		expect(r.systemVoltage).toBe(12);
		expect(r.earthPolarity).toBe('positive');
	});

	it('trims text and fills missing optional fields with empty text', () => {
		const r = vehicleFields.parse({ name: '  Old Bess  ', systemVoltage: 6, earthPolarity: 'negative' });
		expect(r).toEqual({ name: 'Old Bess', make: '', model: '', year: '', systemVoltage: 6, earthPolarity: 'negative', notes: '' });
	});

	const bad: [string, Record<string, unknown>, string, RegExp][] = [
		['a blank name', { name: '   ' }, 'name', /Name is required/],
		['a 9 V system', { systemVoltage: '9' }, 'systemVoltage', /6, 12 or 24/],
		['no voltage chosen', { systemVoltage: '' }, 'systemVoltage', /6, 12 or 24/],
		['an unknown earth', { earthPolarity: 'chassis' }, 'earthPolarity', /negative or positive/],
		['a very long name', { name: 'x'.repeat(81) }, 'name', /at most 80/]
	];
	it.each(bad)('names the field for %s', (_, change, field, message) => {
		const errors = errorsOf(vehicleFields, { ...good, ...change });
		expect(Object.keys(errors)).toEqual([field]);
		expect(errors[field]).toMatch(message);
	});

	it('PATCH takes any subset but not nothing', () => {
		expect(vehiclePatch.parse({ name: 'Renamed' })).toEqual({ name: 'Renamed' });
		expect(vehiclePatch.safeParse({}).success).toBe(false);
	});
});

describe('sign-up and sign-in forms', () => {
	it('names each missing field', () => {
		expect(Object.keys(errorsOf(signUpForm, {})).sort()).toEqual(['displayName', 'email', 'password']);
		expect(Object.keys(errorsOf(signInForm, { email: 'x@y.test' }))).toEqual(['password']);
	});

	it('checks the e-mail address shape', () => {
		expect(errorsOf(signInForm, { email: 'not an address', password: 'p' }).email).toMatch(/e-mail address like/);
		expect(signInForm.parse({ email: ' Ann@Example.test ', password: 'p' }).email).toBe('Ann@Example.test');
	});

	it('keeps the password exactly as typed (no trimming)', () => {
		expect(signUpForm.parse({ displayName: 'Ann', email: 'ann@example.test', password: '  two  spaces  ' }).password).toBe('  two  spaces  ');
	});
});

describe('diagramSave', () => {
	it('needs the revision it edits and the document', () => {
		const r = diagramSave.safeParse({ document: {} });
		expect(r.success).toBe(false);
		expect(fromZod(r.error!).map((i) => i.path)).toEqual(['revision']);
		const r2 = diagramSave.safeParse({ revision: 3 });
		expect(fromZod(r2.error!).map((i) => i.path)).toEqual(['document']);
		expect(diagramSave.parse({ revision: 3, document: { parts: [] } })).toEqual({ revision: 3, document: { parts: [] } });
	});

	it('refuses a revision that is not a positive whole number', () => {
		for (const revision of [0, -1, 1.5, '2']) expect(diagramSave.safeParse({ revision, document: {} }).success).toBe(false);
	});
});
