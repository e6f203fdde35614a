// One way to write a day or a moment everywhere (pages, the checklist and its PDF): the reader's
// locale (the browser's languages, sent as Accept-Language) and time zone (the browser's, kept in
// a cookie), through Intl.DateTimeFormat. The server renders with the same two, so a page reads
// the same before and after the browser takes it over.

export interface Dates {
	locale: string;
	timeZone: string;
}

/** Before the browser has said where it is: English, UTC (and said so beside a time). */
export const DEFAULT_DATES: Dates = { locale: 'en', timeZone: 'UTC' };
export const TIME_ZONE_COOKIE = 'loom-tz';

/** The first language of an Accept-Language header (by its q weights) that Intl can write dates in. */
export function localeFrom(acceptLanguage: string | null | undefined): string {
	const tags = (acceptLanguage ?? '')
		.split(',')
		.map((part, i) => {
			const [tag, ...params] = part.trim().split(';');
			const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
			return { tag: tag.trim(), q: q ? Number(q.slice(2)) : 1, i };
		})
		.filter((t) => t.tag && t.tag !== '*' && Number.isFinite(t.q) && t.q > 0)
		.sort((a, b) => b.q - a.q || a.i - b.i);
	for (const { tag } of tags) {
		try {
			const [supported] = Intl.DateTimeFormat.supportedLocalesOf(tag);
			if (supported) return supported;
		} catch {
			// not a well-formed language tag: try the next
		}
	}
	return DEFAULT_DATES.locale;
}

/** An IANA time zone name the browser sent, if Intl knows it; else UTC. */
export function timeZoneFrom(name: string | null | undefined): string {
	if (!name || name.length > 64) return DEFAULT_DATES.timeZone;
	try {
		return new Intl.DateTimeFormat('en', { timeZone: name }).resolvedOptions().timeZone;
	} catch {
		return DEFAULT_DATES.timeZone;
	}
}

const formats = new Map<string, Intl.DateTimeFormat>();
function format(dates: Dates, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
	const key = `${dates.locale}|${dates.timeZone}|${JSON.stringify(options)}`;
	let made = formats.get(key);
	if (!made) formats.set(key, (made = new Intl.DateTimeFormat(dates.locale, { ...options, timeZone: dates.timeZone })));
	return made;
}

const asDate = (d: Date | string) => (typeof d === 'string' ? new Date(d) : d);

/** A day, e.g. "5 Dec 2026" (en-GB), "Dec 5, 2026" (en-US), "05.12.2026" (de-DE). */
export function dayText(d: Date | string, dates: Dates = DEFAULT_DATES): string {
	return format(dates, { dateStyle: 'medium' }).format(asDate(d));
}

/** A day and time to the minute; "UTC" is added while the reader's zone is not known. */
export function momentText(d: Date | string, dates: Dates = DEFAULT_DATES): string {
	const text = format(dates, { dateStyle: 'medium', timeStyle: 'short' }).format(asDate(d));
	return dates.timeZone === 'UTC' ? `${text} UTC` : text;
}
