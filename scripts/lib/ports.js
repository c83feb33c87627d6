// @ts-check
/**
 * Who holds a TCP port. Linux only, from /proc (no `ss`/`lsof` needed): the listening socket's
 * inode from /proc/net/tcp{,6}, then the process whose file descriptors include that socket.
 * Elsewhere, or without permission to read other users' /proc entries, it answers null.
 */
import fs from 'node:fs';
import { canConnect } from './proc.js';

/** @param {number} port @returns {Set<string>} inodes of sockets listening on that port */
function listeningInodes(port) {
	const inodes = new Set();
	for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
		let text;
		try {
			text = fs.readFileSync(table, 'utf8');
		} catch {
			continue;
		}
		for (const line of text.split('\n').slice(1)) {
			const cols = line.trim().split(/\s+/);
			if (cols.length < 10) continue;
			const localPort = parseInt(cols[1].split(':')[1], 16);
			// State 0A is LISTEN.
			if (localPort === port && cols[3] === '0A') inodes.add(cols[9]);
		}
	}
	return inodes;
}

/** @param {number} pid */
export function commandLine(pid) {
	try {
		return fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').filter(Boolean).join(' ');
	} catch {
		return null;
	}
}

/**
 * The process listening on a port, or null when the system cannot tell.
 * @param {number} port @returns {{ pid: number, command: string } | null}
 */
export function portHolder(port) {
	const inodes = listeningInodes(port);
	if (inodes.size === 0) return null;
	let pids;
	try {
		pids = fs.readdirSync('/proc').filter((d) => /^\d+$/.test(d));
	} catch {
		return null;
	}
	for (const pid of pids) {
		let fds;
		try {
			fds = fs.readdirSync(`/proc/${pid}/fd`);
		} catch {
			continue;
		}
		for (const fd of fds) {
			let target;
			try {
				target = fs.readlinkSync(`/proc/${pid}/fd/${fd}`);
			} catch {
				continue;
			}
			const m = /^socket:\[(\d+)\]$/.exec(target);
			if (m && inodes.has(m[1])) {
				return { pid: Number(pid), command: commandLine(Number(pid)) ?? '?' };
			}
		}
	}
	return null;
}

/**
 * Refuse to go on when a port is taken, naming the holder and the variable that moves the port.
 * @param {{ name: string, host: string, port: number, variable: string }} service
 * @returns {Promise<string | null>} the problem, or null when the port is free
 */
export async function portProblem({ name, host, port, variable }) {
	if (!(await canConnect(host, port))) return null;
	const holder = portHolder(port);
	const who = holder
		? `process ${holder.pid} (${holder.command.slice(0, 160)}) holds it`
		: 'the system could not tell which process holds it';
	return (
		`port ${host}:${port} for the ${name} is already in use: ${who}. ` +
		`Stop that process, or set ${variable} to another port (THERMALITH_PORT_OFFSET moves all of them).`
	);
}
