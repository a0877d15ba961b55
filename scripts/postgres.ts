// The project's private PostgreSQL cluster: found or installed from Debian, created under
// .data/, started on 127.0.0.1 on the project's own port. PostgreSQL refuses to run as root, so
// as root every server command runs as the `postgres` system user.
import { execFileSync, spawnSync } from 'node:child_process';
import { randomBytes, createHash } from 'node:crypto';
import { chmodSync, chownSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync, appendFileSync } from 'node:fs';
import { join } from 'node:path';
import { connect } from 'node:net';
import pg from 'pg';
import { dataDir, postgres, root } from './profile';
import { StepError } from './steps';

const isRoot = process.getuid?.() === 0;
const superuserFile = join(dataDir, 'pg-superuser-password');

function run(cmd: string, args: string[]) {
	const [c, a] = isRoot ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args];
	return spawnSync(c, a, { encoding: 'utf8' });
}

/** The newest PostgreSQL server binaries Debian put on this machine, installing them if there are none. */
export function serverBin(): { bin: string; installed: boolean } {
	const find = () => {
		const base = '/usr/lib/postgresql';
		if (!existsSync(base)) return undefined;
		const versions = readdirSync(base)
			.filter((v) => existsSync(join(base, v, 'bin', 'pg_ctl')))
			.sort((a, b) => Number(b) - Number(a));
		return versions[0] ? join(base, versions[0], 'bin') : undefined;
	};
	const found = find();
	if (found) return { bin: found, installed: false };
	if (!isRoot) {
		throw new StepError(
			'PostgreSQL server is not installed.',
			'Install it with `sudo apt-get install -y postgresql`, then run this again.'
		);
	}
	// Debian would otherwise create and start a system-wide cluster on port 5432 that nobody uses.
	mkdirSync('/etc/postgresql-common', { recursive: true });
	if (!existsSync('/etc/postgresql-common/createcluster.conf')) {
		writeFileSync('/etc/postgresql-common/createcluster.conf', 'create_main_cluster = false\n');
	}
	aptInstall(['postgresql']);
	const after = find();
	if (!after) throw new StepError('apt-get installed postgresql but no pg_ctl was found.', 'Check `ls /usr/lib/postgresql/*/bin`.');
	return { bin: after, installed: true };
}

export function aptInstall(packages: string[]) {
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	const update = spawnSync('apt-get', ['update', '-q'], { stdio: 'inherit', env });
	const install = update.status === 0 && spawnSync('apt-get', ['install', '-y', '-q', ...packages], { stdio: 'inherit', env });
	if (!install || install.status !== 0) {
		throw new StepError(
			`apt-get could not install ${packages.join(', ')}.`,
			'Check the network to the Debian mirrors and that you are root, then run this again.'
		);
	}
}

/**
 * Where the cluster lives: .data/pg, unless the postgres user cannot reach the checkout (a clone
 * under a private home directory, say); then a folder under /var/lib named after the checkout.
 */
export function clusterDir(): string {
	mkdirSync(dataDir, { recursive: true });
	const inTree = join(dataDir, 'pg');
	if (!isRoot) return inTree;
	const reachable = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dataDir]).status === 0;
	if (reachable) return inTree;
	const id = createHash('sha1').update(root).digest('hex').slice(0, 12);
	return `/var/lib/phasewright/${id}/pg`;
}

/** As root, hands files to the postgres user, which runs the server. */
function giveToPostgres(...paths: string[]) {
	if (!isRoot) return;
	const id = (flag: string) => Number(execFileSync('id', [flag, 'postgres'], { encoding: 'utf8' }).trim());
	const [uid, gid] = [id('-u'), id('-g')];
	for (const p of paths) chownSync(p, uid, gid);
}

function pgCtl(bin: string, dir: string, args: string[]) {
	return run(join(bin, 'pg_ctl'), ['-D', dir, ...args]);
}

export function isRunning(bin: string, dir: string) {
	return existsSync(join(dir, 'PG_VERSION')) && pgCtl(bin, dir, ['status']).status === 0;
}

/** Creates the cluster once. The superuser's password is random and kept in .data (mode 600). */
export function initCluster(bin: string, dir: string): boolean {
	if (existsSync(join(dir, 'PG_VERSION'))) return false;
	mkdirSync(dir, { recursive: true });
	const password = randomBytes(18).toString('base64url');
	const pwfile = join(dir, '..', 'pw.tmp');
	writeFileSync(pwfile, password + '\n', { mode: 0o600 });
	giveToPostgres(dir, pwfile);
	chmodSync(dir, 0o700);
	const init = run(join(bin, 'initdb'), [
		'-D',
		dir,
		'-U',
		'postgres',
		'--pwfile',
		pwfile,
		'--auth',
		'scram-sha-256',
		'-E',
		'UTF8',
		'--locale',
		'C'
	]);
	rmSync(pwfile, { force: true });
	if (init.status !== 0) {
		rmSync(dir, { recursive: true, force: true });
		throw new StepError(
			`initdb failed: ${init.stderr.trim()}`,
			'Check free disk space (df -h) and permissions of .data/, then run this again.'
		);
	}
	writeFileSync(superuserFile, password, { mode: 0o600 });
	// Loopback TCP only: no Unix socket, so paths of any length work and nothing else can reach it.
	appendFileSync(
		join(dir, 'postgresql.conf'),
		[
			'',
			'# Phasewright private cluster',
			`listen_addresses = '${postgres.host}'`,
			`port = ${postgres.port}`,
			"unix_socket_directories = ''",
			'max_connections = 200',
			'synchronous_commit = off',
			''
		].join('\n')
	);
	return true;
}

export async function start(bin: string, dir: string) {
	const log = join(dir, '..', 'postgres.log');
	writeFileSync(log, '', { flag: 'a' });
	giveToPostgres(log);
	if (await portTaken(postgres.port)) {
		throw new StepError(
			`port ${postgres.port} on 127.0.0.1 is taken by another program.`,
			`Stop that program, or choose another port for the private cluster with PW_PG_PORT=<port>.`
		);
	}
	// The port of this run (PW_PORT_OFFSET, PW_PG_PORT) wins over the one written at initdb, so one
	// checkout's cluster can serve stacks on different ports.
	const res = pgCtl(bin, dir, ['start', '-w', '-t', '60', '-l', log, '-o', `-p ${postgres.port}`]);
	if (res.status !== 0) {
		const tail = existsSync(log) ? readFileSync(log, 'utf8').trim().split('\n').slice(-5).join('\n    ') : '';
		throw new StepError(`PostgreSQL did not start:\n    ${tail || res.stderr.trim()}`, `Read ${log}; \`npm run stop\` then try again.`);
	}
}

export function stop(bin: string, dir: string) {
	if (isRunning(bin, dir)) pgCtl(bin, dir, ['stop', '-m', 'fast', '-w']);
}

function portTaken(port: number): Promise<boolean> {
	return new Promise((resolve) => {
		const socket = connect({ host: '127.0.0.1', port });
		socket.once('connect', () => (socket.destroy(), resolve(true)));
		socket.once('error', () => resolve(false));
	});
}

function superuser(database = 'postgres') {
	const password = readFileSync(superuserFile, 'utf8').trim();
	return new pg.Client({ host: postgres.host, port: postgres.port, user: 'postgres', password, database });
}

/** The app's role and a database owned by it; with `fresh`, the database is dropped first. */
export async function ensureDatabase(name: string, { fresh = false } = {}): Promise<'created' | 'kept'> {
	const client = superuser();
	await client.connect();
	try {
		const role = await client.query('select 1 from pg_roles where rolname = $1', [postgres.role]);
		if (role.rowCount === 0) {
			await client.query(`create role ${postgres.role} login password '${postgres.password}'`);
		}
		if (fresh) await client.query(`drop database if exists ${name} with (force)`);
		const db = await client.query('select 1 from pg_database where datname = $1', [name]);
		if (db.rowCount !== 0) return 'kept';
		await client.query(`create database ${name} owner ${postgres.role} encoding 'UTF8'`);
		return 'created';
	} finally {
		await client.end();
	}
}
