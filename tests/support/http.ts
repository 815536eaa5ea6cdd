import { randomInt } from 'node:crypto'
import { baseUrl } from './env'

export interface Reply<T = any> {
  status: number
  body: T
  headers: Headers
}

let addressCounter = 0

/** A body sent exactly as given (text that may not be JSON at all), still labelled as JSON. */
export class RawBody {
  constructor(readonly text: string) {}
}

/**
 * A browser-like HTTP client with its own cookie jar and its own client address
 * (the test app trusts X-Forwarded-For), so one test's failed sign-ins never throttle another's.
 */
export class Client {
  private cookies = new Map<string, string>()
  readonly address: string

  constructor(address?: string) {
    addressCounter++
    // Random, so two test files never share an address and so never share its sign-in limit.
    this.address = address ?? `10.${randomInt(250)}.${randomInt(250)}.${addressCounter % 250}`
  }

  /** The raw response (for PDFs and other binary bodies), with this client's cookies. */
  async fetch(method: string, path: string, body?: unknown): Promise<Response> {
    const headers: Record<string, string> = { 'x-forwarded-for': this.address, 'accept': 'application/json' }
    if (body !== undefined) headers['content-type'] = 'application/json'
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    const response = await fetch(new URL(path, baseUrl), { method, headers, body: body === undefined ? undefined : body instanceof RawBody ? body.text : JSON.stringify(body), redirect: 'manual' })
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const [name, ...rest] = pair!.split('=')
      const value = rest.join('=')
      if (/max-age=0|expires=thu, 01 jan 1970/i.test(line) || value === '') this.cookies.delete(name!.trim())
      else this.cookies.set(name!.trim(), value)
    }
    return response
  }

  async request<T = any>(method: string, path: string, body?: unknown): Promise<Reply<T>> {
    const response = await this.fetch(method, path, body)
    const text = await response.text()
    let parsed: unknown = text
    try {
      parsed = text ? JSON.parse(text) : null
    } catch {
      // not JSON: keep the text
    }
    return { status: response.status, body: parsed as T, headers: response.headers }
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path)
  }

  post<T = any>(path: string, body: unknown = {}) {
    return this.request<T>('POST', path, body)
  }

  patch<T = any>(path: string, body: unknown) {
    return this.request<T>('PATCH', path, body)
  }

  async signIn(email: string, password: string) {
    const reply = await this.post('/api/auth/sign-in', { email, password })
    if (reply.status !== 200) throw new Error(`sign-in of ${email} failed: ${reply.status} ${JSON.stringify(reply.body)}`)
    return reply
  }
}

export async function signedIn(email: string, password: string) {
  const client = new Client()
  await client.signIn(email, password)
  return client
}
