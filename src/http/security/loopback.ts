// Without API keys the service is open, so it may only be reachable from this
// machine. 127.0.0.0/8 and ::1 are loopback (RFC 1122 §3.2.1.3, RFC 4291 §2.5.3).
import { isIPv4, isIPv6 } from 'node:net';

export function isLoopbackHost(host: string): boolean {
  const h = host.trim().toLowerCase().replace(/^\[(.*)\]$/, '$1');
  if (h === 'localhost') return true;
  if (isIPv4(h)) return h.startsWith('127.');
  if (isIPv6(h)) {
    if (/^(0{0,4}:){7}0{0,3}1$/.test(h) || h === '::1') return true;
    const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/.exec(h);
    return mapped !== null && mapped[1].startsWith('127.');
  }
  return false;
}
