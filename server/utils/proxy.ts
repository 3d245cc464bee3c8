import type { H3Event } from 'h3'
import proxyaddr from 'proxy-addr'

let trust: ((address: string, hop: number) => boolean) | undefined

/**
 * Forwarded headers are believed only from the proxies named in NUXT_TRUSTED_PROXIES (addresses, CIDR ranges
 * or proxy-addr's names such as `loopback`); with none named, the client is the socket's peer, so nobody can
 * pick their own address by sending a header.
 */
function trusted() {
  if (!trust) {
    const list = String(useRuntimeConfig().trustedProxies ?? '').split(',').map(s => s.trim()).filter(Boolean)
    trust = proxyaddr.compile(list)
  }
  return trust
}

/** The client's address: the socket's peer, or the first untrusted hop of X-Forwarded-For behind a trusted proxy. */
export function clientAddress(event: H3Event): string {
  return proxyaddr(event.node.req, trusted()) || 'unknown'
}

/** Whether the browser reached the site over https, as the public address or a trusted proxy says. */
export function requestIsSecure(event: H3Event): boolean {
  const configured = String(useRuntimeConfig(event).public.siteUrl ?? '')
  if (configured) return configured.startsWith('https:')
  const socket = event.node.req.socket as { encrypted?: boolean, remoteAddress?: string }
  if (socket.encrypted) return true
  const peer = socket.remoteAddress ?? ''
  if (peer && trusted()(peer, 0)) {
    const proto = getRequestHeader(event, 'x-forwarded-proto')?.split(',')[0]?.trim().toLowerCase()
    return proto === 'https'
  }
  return false
}

/** Whether a host name or address is this machine, where plain http never leaves the computer. */
export function isLocalHost(host: string): boolean {
  const bracketed = /^\[([^\]]+)\]/.exec(host)
  const name = (bracketed ? bracketed[1]! : host.split(':').length === 2 ? host.split(':')[0]! : host).toLowerCase()
  return name === 'localhost' || name.endsWith('.localhost') || /^127\./.test(name) || name === '::1' || name === '0:0:0:0:0:0:0:1'
}
