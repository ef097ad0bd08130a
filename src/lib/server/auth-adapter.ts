import SequelizeAdapterBase from '@auth/sequelize-adapter';
import type { Sequelize } from 'sequelize';
import { AuthAccount, AuthSession, AuthVerificationToken, User } from './db/models';

/**
 * The Auth.js Sequelize adapter over Cornicle's own models, whose tables come from migrations
 * (`synchronize: false`); new users are never created by the adapter.
 */
let memo: { sequelize: Sequelize; adapter: ReturnType<typeof build> } | null = null;

export function SequelizeAdapter(sequelize: Sequelize) {
	// The base adapter declares associations on the models, so it is built once per instance.
	if (memo?.sequelize !== sequelize) memo = { sequelize, adapter: build(sequelize) };
	return memo.adapter;
}

function build(sequelize: Sequelize) {
	const base = SequelizeAdapterBase(sequelize, {
		synchronize: false,
		models: {
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			User: User as any,
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			Account: AuthAccount as any,
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			Session: AuthSession as any,
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			VerificationToken: AuthVerificationToken as any
		}
	});
	return {
		...base,
		async createUser(): Promise<never> {
			throw new Error('Accounts are created by an administrator, not at sign-in.');
		}
	};
}
