/** Byte links to the aircraft's telemetry: UDP, TCP or a serial port (the `serialport` package, loaded only when asked for). */
import dgram from 'node:dgram';
import net from 'node:net';
import type { Connection } from './args';
import { LinkError } from './loftline-client';

export interface Transport {
  /** What the link is connected to, for messages. */
  label: string;
  write(bytes: Buffer): Promise<void>;
  onData(cb: (bytes: Buffer) => void): void;
  close(): Promise<void>;
}

/** UDP: datagrams go to HOST:PORT from a local port of our own; what comes back to that port is read. */
async function udp(host: string, port: number): Promise<Transport> {
  const sock = dgram.createSocket(net.isIPv6(host) ? 'udp6' : 'udp4');
  await new Promise<void>((resolve, reject) => {
    sock.once('error', reject);
    sock.bind(0, () => resolve());
  });
  return {
    label: `udp ${host}:${port}`,
    write: (bytes) => new Promise((resolve, reject) => sock.send(bytes, port, host, (err) => (err ? reject(err) : resolve()))),
    onData: (cb) => sock.on('message', (msg) => cb(msg)),
    close: () => new Promise((resolve) => sock.close(() => resolve())),
  };
}

async function tcp(host: string, port: number): Promise<Transport> {
  const sock = net.connect({ host, port });
  await new Promise<void>((resolve, reject) => {
    sock.once('connect', resolve);
    sock.once('error', (err) => reject(new LinkError(`Cannot connect to ${host}:${port} over TCP: ${err.message}.`)));
  });
  return {
    label: `tcp ${host}:${port}`,
    write: (bytes) => new Promise((resolve, reject) => sock.write(bytes, (err) => (err ? reject(err) : resolve()))),
    onData: (cb) => sock.on('data', cb),
    close: () => new Promise((resolve) => sock.end(() => resolve())),
  };
}

async function serial(path: string, baudRate: number): Promise<Transport> {
  let mod: typeof import('serialport');
  try {
    mod = await import('serialport');
  } catch (err) {
    throw new LinkError(`Serial ports need the "serialport" package, which did not load here (${(err as Error).message}). Use --udp or --tcp through a telemetry bridge instead.`);
  }
  const port = new mod.SerialPort({ path, baudRate, autoOpen: false });
  await new Promise<void>((resolve, reject) => port.open((err) => (err ? reject(new LinkError(`Cannot open serial port ${path}: ${err.message}.`)) : resolve())));
  return {
    label: `serial ${path} at ${baudRate} baud`,
    write: (bytes) => new Promise((resolve, reject) => port.write(bytes, (err) => (err ? reject(err) : port.drain(() => resolve())))),
    onData: (cb) => port.on('data', cb),
    close: () => new Promise((resolve) => port.close(() => resolve())),
  };
}

/** Open the connection the options name. */
export function openTransport(c: Connection): Promise<Transport> {
  if (c.kind === 'serial') return serial(c.path, c.baud);
  return c.kind === 'udp' ? udp(c.host, c.port) : tcp(c.host, c.port);
}
