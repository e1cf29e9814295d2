/** One JSON request of the bench scripts to the app they started; a non-2xx answer throws with its text. */
export async function api<T>(base: string, method: string, urlPath: string, token: string | null, body?: unknown): Promise<T> {
  const response = await fetch(`${base}${urlPath}`, {
    method,
    headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!response.ok) throw new Error(`${method} ${urlPath}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}
