import { SequelizeAdapter } from './auth-adapter';
import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { verify } from '@node-rs/argon2';
import { config } from './config';
import { db, Membership, User } from './db';
import { lockedForMinutes, recordAttempt } from './throttle';
import { signInSchema } from '$lib/schemas/auth';
import type { Role } from '$lib/roles';

class LockedOut extends CredentialsSignin {
	code = 'locked';
}

async function membershipOf(userId: number) {
	return Membership.findOne({ where: { userId }, order: [['id', 'ASC']] });
}

export const { handle, signIn, signOut } = SvelteKitAuth(async (event) => {
	const c = config();
	return {
		adapter: SequelizeAdapter(db()),
		secret: c.AUTH_SECRET,
		trustHost: true,
		session: { strategy: 'jwt', maxAge: 12 * 60 * 60 },
		logger: {
			// A failed password is an expected outcome, not a server error worth a stack trace.
			error(e: Error) {
				if ((e as Error & { type?: string }).type !== 'CredentialsSignin') console.error(e);
			}
		},
		pages: { signIn: '/signin', error: '/signin', verifyRequest: '/signin/check-email' },
		providers: [
			Credentials({
				credentials: { email: {}, password: {} },
				async authorize(raw) {
					const parsed = signInSchema.safeParse(raw);
					if (!parsed.success) return null;
					const email = parsed.data.email.toLowerCase();
					const ip = event.getClientAddress();
					if (await lockedForMinutes(email, ip)) throw new LockedOut();
					const user = await User.findOne({ where: { email } });
					const ok =
						!!user?.passwordHash && (await verify(user.passwordHash, parsed.data.password));
					await recordAttempt(email, ip, ok);
					if (!ok || !user) return null;
					return { id: String(user.id), email: user.email, name: user.name };
				}
			}),
			Nodemailer({
				server: c.SMTP_URL,
				from: c.MAIL_FROM,
				maxAge: 15 * 60
			})
		],
		callbacks: {
			// Only people who already have an account may get a sign-in link.
			async signIn({ user }) {
				const id = Number(user.id);
				if (!id) return false;
				return !!(await membershipOf(id));
			},
			async jwt({ token, user }) {
				if (user) {
					const m = await membershipOf(Number(user.id));
					if (!m) throw new Error('No membership');
					token.uid = Number(user.id);
					token.role = m.role;
					token.org = m.organisationId;
				}
				return token;
			},
			session({ session, token }) {
				Object.assign(session.user ?? {}, {
					id: token.uid,
					role: token.role,
					organisationId: token.org
				});
				return session;
			}
		}
	};
});

export type SessionRole = Role;
