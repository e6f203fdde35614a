import { describe, expect, it } from 'vitest';
import { dayText, localeFrom, momentText, timeZoneFrom } from './dates';

// Expected strings are the Unicode CLDR medium date patterns as ICU writes them (Node's full ICU):
// en-US "MMM d, y", en-GB "d MMM y", de-DE "dd.MM.y".
describe('dates', () => {
	const moment = '2026-12-04T13:27:34Z';

	it('writes a day in the reader’s locale (CLDR medium date)', () => {
		expect(dayText(moment, { locale: 'en-US', timeZone: 'UTC' })).toBe('Dec 4, 2026');
		expect(dayText(moment, { locale: 'en-GB', timeZone: 'UTC' })).toBe('4 Dec 2026');
		expect(dayText(moment, { locale: 'de-DE', timeZone: 'UTC' })).toBe('04.12.2026');
	});

	it('writes the day where the reader is, not where the server is', () => {
		// 23:30 UTC on the 4th is already the 5th in Auckland (UTC+13 in December, IANA tz database).
		expect(dayText('2026-12-04T23:30:00Z', { locale: 'en-GB', timeZone: 'Pacific/Auckland' })).toBe('5 Dec 2026');
	});

	it('says UTC beside a time while the reader’s zone is not known', () => {
		expect(momentText(moment, { locale: 'en-GB', timeZone: 'UTC' })).toBe('4 Dec 2026, 13:27 UTC');
		expect(momentText(moment, { locale: 'en-GB', timeZone: 'Europe/London' })).toBe('4 Dec 2026, 13:27');
	});

	it('takes the first language the browser asks for, by weight (RFC 9110 §12.5.4)', () => {
		expect(localeFrom('de-DE,de;q=0.9,en;q=0.8')).toBe('de-DE');
		expect(localeFrom('en;q=0.5, fr-CA;q=0.9')).toBe('fr-CA');
		expect(localeFrom('*')).toBe('en');
		expect(localeFrom('not a tag!!, en-GB;q=0.1')).toBe('en-GB');
		expect(localeFrom(null)).toBe('en');
	});

	it('accepts only time zones Intl knows', () => {
		expect(timeZoneFrom('Europe/Berlin')).toBe('Europe/Berlin');
		expect(timeZoneFrom('Mars/Olympus')).toBe('UTC');
		expect(timeZoneFrom(undefined)).toBe('UTC');
	});
});
