// A static file server of the kind the built app uses for its own assets (Node's http with
// sirv, as adapter-node serves them): the reference the map endpoint is timed against.
import { createServer } from 'node:http';
import sirv from 'sirv';

const [dir, port] = process.argv.slice(2);
const serve = sirv(dir, { dev: false, etag: false });
createServer((req, res) =>
	serve(req, res, () => {
		res.statusCode = 404;
		res.end();
	})
).listen(Number(port), '127.0.0.1', () => console.log(`static on ${port}`));
