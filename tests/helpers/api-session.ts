import type { TestPerson } from './factories';
import { HttpBrowser } from './http-browser';
import { signIn, type TestStack } from './stack';

export interface ApiAnswer<T = unknown> {
  status: number;
  body: T;
  headers: Headers;
  bytes: Buffer;
}

export interface ApiSession {
  person: TestPerson;
  get<T = unknown>(path: string): Promise<ApiAnswer<T>>;
  post<T = unknown>(path: string, body?: unknown): Promise<ApiAnswer<T>>;
  patch<T = unknown>(path: string, body: unknown): Promise<ApiAnswer<T>>;
  put<T = unknown>(path: string, body: unknown): Promise<ApiAnswer<T>>;
  delete<T = unknown>(path: string): Promise<ApiAnswer<T>>;
  /** A multipart form as the app's upload form sends it. */
  upload<T = unknown>(path: string, form: FormData): Promise<ApiAnswer<T>>;
}

async function answer<T>(response: Response): Promise<ApiAnswer<T>> {
  const bytes = Buffer.from(await response.arrayBuffer());
  const type = response.headers.get('content-type') ?? '';
  const body = (type.includes('application/json') ? JSON.parse(bytes.toString('utf8')) : undefined) as T;
  return { status: response.status, body, headers: response.headers, bytes };
}

/** A person signed in through the identity provider, calling the API as the app's pages do. */
export async function signedIn(stack: TestStack, person: TestPerson): Promise<ApiSession> {
  const browser = new HttpBrowser();
  await signIn(stack, browser, person);
  const call = async <T>(method: string, path: string, body?: unknown): Promise<ApiAnswer<T>> => {
    const isForm = body instanceof FormData;
    const response = await browser.visit(`${stack.origin}${path}`, {
      method,
      headers: {
        ...(method === 'GET' ? {} : stack.sameOrigin),
        ...(body !== undefined && !isForm ? { 'content-type': 'application/json' } : {}),
      },
      body: isForm ? body : body !== undefined ? JSON.stringify(body) : undefined,
    });
    return answer<T>(response);
  };
  return {
    person,
    get: (path) => call('GET', path),
    post: (path, body) => call('POST', path, body),
    patch: (path, body) => call('PATCH', path, body),
    put: (path, body) => call('PUT', path, body),
    delete: (path) => call('DELETE', path),
    upload: (path, form) => call('POST', path, form),
  };
}

/** The paths of the fields a 400 names, e.g. ["body.name", "body.style"]. */
export function issuePaths(body: unknown): string[] {
  const issues = (body as { error?: { issues?: { path: string }[] } }).error?.issues ?? [];
  return issues.map((issue) => issue.path).sort();
}
