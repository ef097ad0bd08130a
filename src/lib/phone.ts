import {
	isSupportedCountry,
	parsePhoneNumberWithError,
	ParseError,
	type CountryCode
} from 'libphonenumber-js/max';

// The `max` metadata checks the digits of each numbering plan, not only the length, so a number
// that cannot exist is refused before an SMS is ever queued to it. It is larger than the default
// metadata; keep this module out of browser code.

export type PhoneParse =
	| { ok: true; e164: string; national: string; international: string; country: string | null }
	| { ok: false; message: string };

const REASONS: Record<string, string> = {
	NOT_A_NUMBER: 'is not a phone number',
	INVALID_COUNTRY: 'needs a valid country code after the +',
	TOO_SHORT: 'is too short',
	TOO_LONG: 'is too long',
	INVALID_LENGTH: 'has the wrong number of digits'
};

const regionNames = new Intl.DisplayNames(['en'], { type: 'region' });

/** The country code to read national numbers with: the organisation's if known, else US. */
export function phoneCountry(country: string | null | undefined): CountryCode {
	const c = (country ?? '').toUpperCase();
	return isSupportedCountry(c) ? c : 'US';
}

export function countryName(country: string) {
	return regionNames.of(country) ?? country;
}

/**
 * Reads a phone number as a person types it: international (+44 20 7946 0958) or national in
 * `defaultCountry` ((701) 555-0172). Returns its E.164 form, or why it was refused; `label`
 * names the field in the message.
 */
export function parsePhone(
	input: string,
	defaultCountry: CountryCode,
	label = 'Phone number'
): PhoneParse {
	const text = input.trim();
	if (!text) return { ok: false, message: `${label} is empty.` };
	try {
		const p = parsePhoneNumberWithError(text, { defaultCountry });
		if (!p.isValid()) {
			const where = p.country ?? (text.startsWith('+') ? null : defaultCountry);
			return {
				ok: false,
				message: `${label} is not a valid number${where ? ` in ${countryName(where)}` : ''}; check the digits${text.startsWith('+') ? '' : ', or start with + and the country code'}.`
			};
		}
		return {
			ok: true,
			e164: p.number,
			national: p.formatNational(),
			international: p.formatInternational(),
			country: p.country ?? null
		};
	} catch (e) {
		if (!(e instanceof ParseError)) throw e;
		return { ok: false, message: `${label} ${REASONS[e.message] ?? 'could not be read'}.` };
	}
}

/** An E.164 number as people read it: national form at home, international otherwise. */
export function displayPhone(e164: string, home: CountryCode) {
	const p = parsePhone(e164, home);
	if (!p.ok) return e164;
	return p.country === home ? p.national : p.international;
}

/** An E.164 number with all but its calling code and last two digits hidden (+1 ••••••••72). */
export function maskPhone(e164: string) {
	try {
		const p = parsePhoneNumberWithError(e164);
		const n = p.nationalNumber;
		return `+${p.countryCallingCode} ${'•'.repeat(Math.max(0, n.length - 2))}${n.slice(-2)}`;
	} catch {
		return '•'.repeat(Math.max(0, e164.length - 2)) + e164.slice(-2);
	}
}
