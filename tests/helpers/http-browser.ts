/**
 * A browser's cookie and redirect handling over plain fetch, as far as sign-in flows need it:
 * one cookie store per host (the app on localhost and the provider on 127.0.0.1 stay apart).
 */
export class HttpBrowser {
  readonly #jars = new Map<string, Map<string, string>>();
  readonly seenCookieNames = new Set<string>();

  cookies(url: string | URL): Map<string, string> {
    const host = new URL(url).host;
    let jar = this.#jars.get(host);
    if (!jar) this.#jars.set(host, (jar = new Map()));
    return jar;
  }

  cookieHeader(url: string | URL): string {
    return [...this.cookies(url)].map(([name, value]) => `${name}=${value}`).join('; ');
  }

  /** Copies the cookies of one host, as an attacker replaying a stolen cookie would. */
  snapshot(url: string | URL): Map<string, string> {
    return new Map(this.cookies(url));
  }

  restore(url: string | URL, cookies: Map<string, string>) {
    const jar = this.cookies(url);
    jar.clear();
    for (const [name, value] of cookies) jar.set(name, value);
  }

  #store(url: string, response: Response) {
    const jar = this.cookies(url);
    for (const line of response.headers.getSetCookie()) {
      const [pair = ''] = line.split(';');
      const name = pair.slice(0, pair.indexOf('=')).trim();
      const value = pair.slice(pair.indexOf('=') + 1).trim();
      this.seenCookieNames.add(name);
      if (value === '' || /expires=Thu, 01 Jan 1970/i.test(line)) jar.delete(name);
      else jar.set(name, value);
    }
  }

  async visit(url: string | URL, init: RequestInit = {}): Promise<Response> {
    const href = new URL(url).href;
    const headers = new Headers(init.headers);
    const cookie = this.cookieHeader(href);
    if (cookie) headers.set('cookie', cookie);
    const response = await fetch(href, { ...init, headers, redirect: 'manual' });
    this.#store(href, response);
    // Like a browser, wait for the whole response: the server may still be saving the session
    // while the last bytes are on their way.
    await response.clone().arrayBuffer();
    return response;
  }

  postForm(url: string, fields: Record<string, string> | URLSearchParams) {
    return this.visit(url, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams(fields).toString(),
    });
  }

  /** Follows redirects until one points outside `withinOrigin` (returned as a URL) or a page answers. */
  async followWithin(withinOrigin: string, start: string): Promise<Response | string> {
    let url = start;
    for (let hop = 0; hop < 10; hop += 1) {
      if (new URL(url).origin !== withinOrigin) return url;
      const response = await this.visit(url);
      if (response.status < 300 || response.status >= 400) return response;
      url = location(response, url);
    }
    throw new Error('too many redirects');
  }
}

export function location(response: Response, base: string): string {
  const target = response.headers.get('location');
  if (!target) throw new Error(`expected a redirect, got ${response.status}`);
  return new URL(target, base).href;
}

const unescapeHtml = (value: string) =>
  value
    .replaceAll('&quot;', '"')
    .replaceAll('&#39;', "'")
    .replaceAll('&lt;', '<')
    .replaceAll('&gt;', '>')
    .replaceAll('&amp;', '&');

/** The first form on a page: where it posts and its hidden fields. */
export function readForm(html: string, base: string): { action: string; fields: URLSearchParams } {
  const action = /<form[^>]*\saction="([^"]*)"/.exec(html)?.[1];
  if (action === undefined) throw new Error(`no form on the page:\n${html}`);
  const fields = new URLSearchParams();
  for (const [input] of html.matchAll(/<input\b[^>]*>/g)) {
    const name = /\sname="([^"]*)"/.exec(input)?.[1];
    if (name !== undefined && /type="hidden"/.test(input)) {
      fields.append(name, unescapeHtml(/\svalue="([^"]*)"/.exec(input)?.[1] ?? ''));
    }
  }
  return { action: new URL(unescapeHtml(action), base).href, fields };
}
