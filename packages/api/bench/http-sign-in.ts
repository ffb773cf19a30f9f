/**
 * Signs in to a running Cairn over HTTP through the local fake identity
 * provider, as a browser would (login → persona picker → ACS), and returns
 * the session's Cookie header and CSRF token. For benchmarks that drive a
 * real API process; development fakes only.
 */
const field = (html: string, name: string): string => {
  const match = new RegExp(`name="${name}" value="([^"]*)"`).exec(html);
  return (match?.[1] ?? '')
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
};

const cookiesOf = (res: Response): string[] =>
  res.headers.getSetCookie().map((c) => c.split(';')[0]!);

export async function httpSignIn(
  baseUrl: string,
  persona: string,
): Promise<{ cookie: string; csrfToken: string }> {
  const login = await fetch(`${baseUrl}/api/auth/saml/login?returnTo=/`, { redirect: 'manual' });
  const jar = cookiesOf(login);
  const location = login.headers.get('location');
  if (login.status !== 302 || !location) throw new Error(`login answered ${login.status}`);
  const sso = new URL(location);
  const picked = await fetch(`${sso.origin}${sso.pathname}`, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({
      SAMLRequest: sso.searchParams.get('SAMLRequest') ?? '',
      RelayState: sso.searchParams.get('RelayState') ?? '',
      persona,
    }),
  });
  const html = await picked.text();
  if (picked.status !== 200) throw new Error(`the identity provider answered ${picked.status}`);
  const acs = await fetch(`${baseUrl}/api/auth/saml/acs`, {
    method: 'POST',
    redirect: 'manual',
    headers: {
      'content-type': 'application/x-www-form-urlencoded',
      cookie: jar.join('; '),
    },
    body: new URLSearchParams({
      SAMLResponse: field(html, 'SAMLResponse'),
      RelayState: field(html, 'RelayState'),
    }),
  });
  if (acs.status !== 303) throw new Error(`sign-in as ${persona} answered ${acs.status}`);
  const cookie = [...jar, ...cookiesOf(acs)].join('; ');
  const session = (await (
    await fetch(`${baseUrl}/api/session`, { headers: { cookie } })
  ).json()) as {
    csrfToken?: string;
    user?: unknown;
  };
  if (!session.user) throw new Error(`sign-in as ${persona} left no session`);
  return { cookie, csrfToken: session.csrfToken ?? '' };
}
