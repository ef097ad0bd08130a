import { Op } from 'sequelize';
import { LoginAttempt } from './db/models';

export const LOCK_WINDOW_MS = 15 * 60_000;
export const MAX_FAILURES_PER_EMAIL = 5;
export const MAX_FAILURES_PER_IP = 30;

/** Minutes until sign-in is allowed again for this e-mail or address, or 0 when not locked. */
export async function lockedForMinutes(
	email: string,
	ip: string,
	now = new Date()
): Promise<number> {
	const since = new Date(now.getTime() - LOCK_WINDOW_MS);
	const [byEmail, byIp] = await Promise.all([
		LoginAttempt.findAll({
			where: { email, succeeded: false, createdAt: { [Op.gte]: since } },
			order: [['createdAt', 'DESC']],
			limit: MAX_FAILURES_PER_EMAIL,
			attributes: ['createdAt']
		}),
		LoginAttempt.count({ where: { ip, succeeded: false, createdAt: { [Op.gte]: since } } })
	]);
	const lastSuccess = await LoginAttempt.findOne({
		where: { email, succeeded: true, createdAt: { [Op.gte]: since } },
		order: [['createdAt', 'DESC']],
		attributes: ['createdAt']
	});
	const failures = byEmail.filter((a) => !lastSuccess || a.createdAt > lastSuccess.createdAt);
	let until = 0;
	if (failures.length >= MAX_FAILURES_PER_EMAIL) {
		until = failures[0].createdAt.getTime() + LOCK_WINDOW_MS;
	}
	if (byIp >= MAX_FAILURES_PER_IP) until = Math.max(until, now.getTime() + LOCK_WINDOW_MS);
	return until > now.getTime() ? Math.ceil((until - now.getTime()) / 60_000) : 0;
}

export async function recordAttempt(email: string, ip: string, succeeded: boolean) {
	await LoginAttempt.create({ email, ip, succeeded });
}
