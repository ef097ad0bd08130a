import { describe, expect, it } from 'vitest';
import { displayPhone, maskPhone, parsePhone, phoneCountry } from './phone';

const e164 = (input: string, country: Parameters<typeof parsePhone>[1]) => {
	const r = parsePhone(input, country);
	return r.ok ? r.e164 : r.message;
};

describe('parsePhone', () => {
	it('reads national forms with the default country', () => {
		// libphonenumber-js README ("parsePhoneNumber('(213) 373-42-53 ext. 1234', 'US')",
		// number +12133734253).
		expect(e164('(213) 373-4253', 'US')).toBe('+12133734253');
		expect(e164('213.373.4253', 'US')).toBe('+12133734253');
		// libphonenumber-js README: "parsePhoneNumber(' 8 (800) 555-35-35 ', 'RU')" is +78005553535.
		expect(e164(' 8 (800) 555-35-35 ', 'RU')).toBe('+78005553535');
		// Google libphonenumber metadata example numbers, as shipped in
		// libphonenumber-js/mobile/examples: GB mobile 7400123456, DE mobile 15123456789.
		expect(e164('07400 123456', 'GB')).toBe('+447400123456');
		expect(e164('0151 23456789', 'DE')).toBe('+4915123456789');
	});

	it('ignores the default country for international input', () => {
		// libphonenumber-js README: parsePhoneNumber('+12133734253').
		expect(e164('+1 213 373 4253', 'GB')).toBe('+12133734253');
		expect(e164('+44 7400 123456', 'US')).toBe('+447400123456');
	});

	it('gives national and international forms for display', () => {
		const r = parsePhone('+12133734253', 'US');
		expect(r).toMatchObject({
			ok: true,
			national: '(213) 373-4253',
			international: '+1 213 373 4253',
			country: 'US'
		});
		expect(displayPhone('+12133734253', 'US')).toBe('(213) 373-4253');
		expect(displayPhone('+447400123456', 'US')).toBe('+44 7400 123456');
	});

	it('refuses what cannot be a number, naming the field', () => {
		const refuse = (input: string, country: Parameters<typeof parsePhone>[1] = 'US') => {
			const r = parsePhone(input, country, 'Mobile number');
			expect(r.ok).toBe(false);
			return r.ok ? '' : r.message;
		};
		expect(refuse('')).toBe('Mobile number is empty.');
		expect(refuse('call me')).toBe('Mobile number is not a phone number.');
		expect(refuse('5')).toBe('Mobile number is too short.');
		expect(refuse('+999 1112223333')).toBe('Mobile number needs a valid country code after the +.');
		// Seven digits miss the US area code; 123 is no US area code (North American plan: area
		// codes do not start with 0 or 1, from memory).
		expect(refuse('555-0172')).toMatch(/^Mobile number is not a valid number in United States/);
		expect(refuse('(123) 456-7890')).toMatch(/not a valid number in United States/);
		expect(refuse('+44 20 7946')).toMatch(/^Mobile number is not a valid number/);
		// Ofcom sets 07700 900000 to 900999 aside for drama; Google's metadata (which
		// libphonenumber-js ships) leaves that range out, so no text can go to one.
		expect(refuse('07700 900123', 'GB')).toMatch(/not a valid number in United Kingdom/);
	});
});

describe('phoneCountry', () => {
	it('uses the organisation country when the library knows it, else US', () => {
		expect(phoneCountry('gb')).toBe('GB');
		expect(phoneCountry('ZZ')).toBe('US');
		expect(phoneCountry(null)).toBe('US');
	});
});

describe('maskPhone', () => {
	it('keeps the calling code and the last two digits', () => {
		expect(maskPhone('+17015550172')).toBe('+1 ••••••••72');
		expect(maskPhone('+447400123456')).toBe('+44 ••••••••56');
	});
});
