import { BlockList, isIP } from 'node:net';

/** The header our auth route sets from the connection's address; better-auth reads only this one. */
export const CLIENT_IP_HEADER = 'x-lossline-client-ip';

/** Headers a client could set to claim another address, host or scheme. */
export const FORWARDED_HEADERS = ['x-forwarded-for', 'x-forwarded-host', 'x-forwarded-proto', 'x-forwarded-port', 'forwarded'] as const;

/**
 * TRUST_PROXY: the address (or addresses, comma-separated; IPv4/IPv6, CIDR allowed) of the reverse
 * proxy in front of Lossline. Only a connection from one of these may tell us the client's address
 * in X-Forwarded-For. Empty: nobody may, and the connection's own address counts.
 */
export function parseTrustProxy(value: string | undefined): BlockList {
  const list = new BlockList();
  for (const raw of (value ?? '').split(',').map((s) => s.trim()).filter(Boolean)) {
    const [addr, bits] = raw.split('/');
    const family = isIP(addr ?? '');
    if (!family) throw new Error(`TRUST_PROXY: "${raw}" is not an IP address or CIDR range (give the proxy's address, e.g. 127.0.0.1 or 10.0.0.0/8).`);
    const type = family === 6 ? 'ipv6' : 'ipv4';
    if (bits !== undefined) {
      const n = Number(bits);
      if (!Number.isInteger(n) || n < 0 || n > (family === 6 ? 128 : 32)) throw new Error(`TRUST_PROXY: "${raw}" has an invalid prefix length.`);
      list.addSubnet(addr!, n, type);
    } else list.addAddress(addr!, type);
  }
  return list;
}

function normalise(addr: string | undefined): string | undefined {
  if (!addr) return undefined;
  const a = addr.trim().replace(/^\[|\]$/g, '');
  const mapped = a.match(/^::ffff:(\d+\.\d+\.\d+\.\d+)$/i);
  return mapped ? mapped[1] : a;
}

function trusted(list: BlockList, addr: string | undefined): boolean {
  const a = normalise(addr);
  if (!a) return false;
  const family = isIP(a);
  if (!family) return false;
  return list.check(a, family === 6 ? 'ipv6' : 'ipv4');
}

/**
 * The client's address for a connection from `peer` carrying `forwardedFor` (X-Forwarded-For).
 * The header counts only when the peer is a trusted proxy; then the chain is read from the right,
 * skipping trusted proxies, and the first address a trusted proxy vouches for is the client.
 */
export function clientAddressOf(peer: string | undefined, forwardedFor: string | undefined, proxies: BlockList): string {
  const self = normalise(peer) ?? 'unknown';
  if (!forwardedFor || !trusted(proxies, self)) return self;
  const chain = forwardedFor.split(',').map((s) => normalise(s)).filter((s): s is string => !!s && isIP(s) > 0);
  for (let i = chain.length - 1; i >= 0; i--) {
    if (!trusted(proxies, chain[i])) return chain[i]!;
  }
  return chain[0] ?? self;
}

/**
 * Rewrites a Node request's headers in place before the app sees them: forwarded headers from an
 * untrusted peer are dropped, and X-Forwarded-For is set to the one address that counts (the app's
 * clientAddress reads it). Used by scripts/serve.ts for every request.
 */
export function settleForwardedHeaders(headers: Record<string, string | string[] | undefined>, peer: string | undefined, proxies: BlockList): string {
  const xff = headers['x-forwarded-for'];
  const client = clientAddressOf(peer, Array.isArray(xff) ? xff.join(',') : xff, proxies);
  if (!trusted(proxies, peer)) for (const h of FORWARDED_HEADERS) delete headers[h];
  delete headers[CLIENT_IP_HEADER];
  headers['x-forwarded-for'] = client;
  return client;
}
