import type { TestUser } from './fixtures.js';
import { TEST_PASSWORD } from './fixtures.js';

/**
 * The same `{ send, expectOk }` client as `apiAs` in records.ts, over real HTTP against a running
 * server (the e2e project's), so the records.ts helpers arrange data for browser tests too.
 */
export async function httpApiAs(baseUrl: string, user: Pick<TestUser, 'email'>, password = TEST_PASSWORD) {
  const signIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: user.email, password }),
  });
  if (signIn.status !== 200) throw new Error(`sign-in as ${user.email} failed: ${signIn.status} ${await signIn.text()}`);
  const { accessToken } = (await signIn.json()) as { accessToken: string };

  const send = async (
    method: 'get' | 'post' | 'patch' | 'put' | 'delete',
    path: string,
    body?: object,
    headers: Record<string, string> = {},
  ): Promise<{ status: number; body: any }> => {
    const res = await fetch(`${baseUrl}${path}`, {
      method: method.toUpperCase(),
      headers: { Authorization: `Bearer ${accessToken}`, ...(body ? { 'Content-Type': 'application/json' } : {}), ...headers },
      body: body ? JSON.stringify(body) : undefined,
    });
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : undefined };
  };
  const expectOk = async (method: Parameters<typeof send>[0], path: string, body?: object, headers?: Record<string, string>) => {
    const res = await send(method, path, body, headers);
    if (res.status >= 300) throw new Error(`${method.toUpperCase()} ${path} → ${res.status} ${JSON.stringify(res.body)}`);
    return res.body;
  };
  return { send, expectOk };
}
