import { spawn, type ChildProcess, type SpawnOptions } from 'node:child_process';
import { setTimeout as sleep } from 'node:timers/promises';

const children = new Set<ChildProcess>();

/** Starts a long-running child whose output is prefixed with its name. */
export function startProcess(
	name: string,
	cmd: string,
	args: string[],
	opts: SpawnOptions & { quiet?: boolean } = {}
): ChildProcess {
	const child = spawn(cmd, args, { stdio: ['ignore', 'pipe', 'pipe'], ...opts });
	children.add(child);
	const prefix = (buf: Buffer) =>
		buf
			.toString()
			.split('\n')
			.filter(Boolean)
			.map((l) => `[${name}] ${l}`)
			.join('\n') + '\n';
	if (!opts.quiet) {
		child.stdout?.on('data', (b) => process.stdout.write(prefix(b)));
		child.stderr?.on('data', (b) => process.stderr.write(prefix(b)));
	} else {
		child.stdout?.resume();
		child.stderr?.on('data', (b) => process.stderr.write(prefix(b)));
	}
	child.on('exit', () => children.delete(child));
	return child;
}

/** Runs a command to completion with inherited output; resolves to its exit code. */
export function runCommand(cmd: string, args: string[], opts: SpawnOptions = {}): Promise<number> {
	return new Promise((resolve) => {
		const child = spawn(cmd, args, { stdio: 'inherit', ...opts });
		children.add(child);
		child.on('exit', (code, signal) => {
			children.delete(child);
			resolve(code ?? (signal ? 1 : 0));
		});
	});
}

/** Waits until an HTTP URL answers (any status), or throws after `ms`. */
export async function waitForHttp(url: string, ms = 30_000) {
	const until = Date.now() + ms;
	for (;;) {
		try {
			await fetch(url, { signal: AbortSignal.timeout(2_000) });
			return;
		} catch {
			if (Date.now() > until) throw new Error(`${url} did not answer within ${ms / 1000} s`);
			await sleep(200);
		}
	}
}

/** Stops every child this process started (SIGTERM, then SIGKILL after a grace period). */
export async function stopAll() {
	const list = [...children];
	for (const c of list) c.kill('SIGTERM');
	const until = Date.now() + 5_000;
	while ([...children].length && Date.now() < until) await sleep(100);
	for (const c of children) c.kill('SIGKILL');
}
