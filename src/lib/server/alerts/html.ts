import { CAUTIONS } from '../../cautions';
import type { Figure } from './figures';

export const esc = (s: string) =>
	s.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!
	);

export interface MailParts {
	heading: string;
	intro: string[];
	figures: Figure[];
	/** Extra titled blocks of lines (the recommendation itself, lists in the digest). */
	sections?: { title: string; lines: string[] }[];
	link: { href: string; label: string };
	cautions: boolean;
	settingsUrl: string;
}

/** The plain-text part: the same content as the HTML, for every mail client. */
export function mailText(p: MailParts): string {
	const out = [p.heading, '', ...p.intro];
	if (p.figures.length) out.push('', 'Figures', ...p.figures.map(([k, v]) => `- ${k}: ${v}`));
	for (const s of p.sections ?? []) out.push('', s.title, ...s.lines.map((l) => `- ${l}`));
	if (p.cautions) {
		out.push('', 'Cautions');
		for (const c of CAUTIONS) out.push(`- ${c.title}: ${c.text}`);
	}
	out.push('', `${p.link.label}: ${p.link.href}`, '', `Alert settings: ${p.settingsUrl}`);
	return out.join('\n');
}

const td = 'padding:4px 12px 4px 0;vertical-align:top';

/** The HTML part: plain tables and inline styles, which mail clients keep. */
export function mailHtml(p: MailParts): string {
	const figures = p.figures.length
		? `<h2 style="font-size:16px;margin:16px 0 4px">Figures</h2><table style="border-collapse:collapse">${p.figures
				.map(
					([k, v]) =>
						`<tr><th style="${td};text-align:left;font-weight:600">${esc(k)}</th><td style="${td}">${esc(v)}</td></tr>`
				)
				.join('')}</table>`
		: '';
	const sections = (p.sections ?? [])
		.map(
			(s) =>
				`<h2 style="font-size:16px;margin:16px 0 4px">${esc(s.title)}</h2><ul>${s.lines.map((l) => `<li>${esc(l)}</li>`).join('')}</ul>`
		)
		.join('');
	const cautions = p.cautions
		? `<div style="border:2px solid #b7791f;border-radius:6px;padding:8px 12px;margin:16px 0"><h2 style="font-size:16px;margin:0 0 4px">Cautions</h2><ul>${CAUTIONS.map(
				(c) => `<li><strong>${esc(c.title)}:</strong> ${esc(c.text)}</li>`
			).join('')}</ul></div>`
		: '';
	return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#2b2620;line-height:1.45">
<h1 style="font-size:20px">${esc(p.heading)}</h1>${p.intro.map((l) => `<p>${esc(l)}</p>`).join('')}
${figures}${sections}${cautions}
<p><a href="${esc(p.link.href)}" style="color:#3f6b3a">${esc(p.link.label)}</a></p>
<p style="font-size:12px;color:#6b6358">You get this because of your <a href="${esc(p.settingsUrl)}">alert settings</a>.</p>
</body></html>`;
}
