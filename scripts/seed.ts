// Seeds the demo scenario into DATABASE_URL (idempotent): `npm run db:seed`.
import { connect } from '../src/lib/server/db/connect';
import { seedDemo } from '../src/lib/server/db/seeders/demo';

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('DATABASE_URL is not set');
	process.exit(2);
}
const sequelize = connect({ url });
try {
	console.log(await seedDemo(sequelize));
} finally {
	await sequelize.close();
}
