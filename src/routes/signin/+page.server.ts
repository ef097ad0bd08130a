import { fail, isRedirect, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { AuthError } from '@auth/sveltekit';
import { signIn } from '$lib/server/auth';
import { lockedForMinutes } from '$lib/server/throttle';
import { HOME_BY_ROLE } from '$lib/roles';
import { linkSchema, signInSchema } from '$lib/schemas/auth';
import type { Actions, PageServerLoad } from './$types';

const passwordAdapter = zod4(signInSchema);
const linkAdapter = zod4(linkSchema);

const URL_ERRORS: Record<string, string> = {
	Verification: 'That sign-in link has expired or was already used. Ask for a new one.',
	AccessDenied: 'That account cannot sign in here. Ask your administrator.',
	Configuration: 'Sign-in is not available right now. Try again in a moment.'
};

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, HOME_BY_ROLE[locals.user.role]);
	const err = url.searchParams.get('error');
	return {
		passwordForm: await superValidate(passwordAdapter, { id: 'password' }),
		linkForm: await superValidate(linkAdapter, { id: 'link' }),
		notice: err ? (URL_ERRORS[err] ?? 'Sign-in did not work. Try again.') : null,
		redirectTo: safeRedirect(url.searchParams.get('redirectTo'))
	};
};

function safeRedirect(to: string | null) {
	return to && to.startsWith('/') && !to.startsWith('//') ? to : '/';
}

/** Runs Auth.js's sign-in and reports the error code of a failed attempt, if any. */
async function authSignIn(event: Parameters<Actions[string]>[0]): Promise<string | null> {
	try {
		await signIn(event);
	} catch (e) {
		// Auth.js throws its sign-in errors (with a code) rather than redirecting in this mode.
		if (e instanceof AuthError) return (e as AuthError & { code?: string }).code ?? e.type;
		if (!isRedirect(e)) throw e;
		const to = new URL(e.location, event.url);
		if (to.searchParams.get('error'))
			return to.searchParams.get('code') ?? to.searchParams.get('error');
		throw e;
	}
	return null;
}

export const actions: Actions = {
	password: async (event) => {
		const form = await superValidate(event.request.clone(), passwordAdapter, { id: 'password' });
		if (!form.valid) return fail(400, { passwordForm: form });
		const code = await authSignIn(event);
		if (code === 'locked') {
			const minutes = await lockedForMinutes(
				form.data.email.toLowerCase(),
				event.getClientAddress()
			);
			return message(
				form,
				`Too many failed attempts for this account. Try again in ${Math.max(minutes, 1)} minute(s), or use a sign-in link.`,
				{ status: 429 }
			);
		}
		if (code) {
			form.data.password = '';
			return setError(form, 'password', 'Wrong e-mail address or password.');
		}
		redirect(303, '/');
	},
	link: async (event) => {
		const form = await superValidate(event.request.clone(), linkAdapter, { id: 'link' });
		if (!form.valid) return fail(400, { linkForm: form });
		// Unknown addresses land on the same page, so the form never reveals who has an account.
		await authSignIn(event);
		redirect(303, '/signin/check-email');
	}
};
