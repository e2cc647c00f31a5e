export const DEMO_PASSWORD = 'tidewell-demo'

export interface Reply<T = any> { // eslint-disable-line @typescript-eslint/no-explicit-any
  status: number
  headers: Headers
  body: T
}

/** A tiny HTTP client that keeps the session cookie, like a browser would. */
export class Client {
  private cookies = new Map<string, string>()

  constructor(readonly baseUrl: string) {}

  static async signIn(baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<Client> {
    const client = new Client(baseUrl)
    const reply = await client.post('/api/auth/sign-in', { email, password })
    if (reply.status !== 200) throw new Error(`sign-in for ${email} answered ${reply.status}`)
    return client
  }

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Reply> {
    const response = await fetch(new URL(path, this.baseUrl), {
      method,
      headers: {
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
        ...(this.cookies.size ? { cookie: [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : JSON.stringify(body),
      redirect: 'manual',
    })
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const [name, ...value] = pair!.split('=')
      if (/max-age=0|expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name!.trim())
      else this.cookies.set(name!.trim(), value.join('='))
    }
    const text = await response.text()
    let parsed: unknown = text
    if ((response.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text)
    return { status: response.status, headers: response.headers, body: parsed }
  }

  get(path: string) {
    return this.request('GET', path)
  }

  post(path: string, body: unknown = {}) {
    return this.request('POST', path, body)
  }

  put(path: string, body: unknown) {
    return this.request('PUT', path, body)
  }

  patch(path: string, body: unknown) {
    return this.request('PATCH', path, body)
  }

  delete(path: string) {
    return this.request('DELETE', path)
  }
}
