/** What a refused sign-in means for the person (codes from /sign-in?refused=<code>). */
export interface RefusalText {
  title: string;
  detail: string;
}

const notVerified: RefusalText = {
  title: 'Cairn could not verify this sign-in',
  detail:
    "The answer from your organisation's sign-in service did not pass Cairn's security checks, so you were not signed in. The attempt has been recorded. Try again; if it keeps happening, tell your IT team, quoting the reference below.",
};

const startAgain: RefusalText = {
  title: 'This sign-in cannot be used',
  detail:
    'Cairn accepts each sign-in once, and only one that it started itself. Start again with the button below.',
};

const tooSlow: RefusalText = {
  title: 'The sign-in took too long',
  detail:
    "The sign-in expired before it reached Cairn (or a computer's clock is wrong). Start again with the button below.",
};

const incomplete: RefusalText = {
  title: 'Your organisation has not given Cairn what it needs',
  detail:
    'Your organisation signed you in, but without a role or practices that Cairn can use. Ask your regional lead to check your account, quoting the reference below.',
};

const texts: Record<string, RefusalText> = {
  deactivated: {
    title: 'Your Cairn account has been deactivated',
    detail:
      'Your organisation signed you in, but your access to Cairn has been switched off. If you still need Cairn, ask your regional lead to reactivate your account.',
  },
  'unknown-user': {
    title: 'Cairn does not know you yet',
    detail:
      'Your organisation signed you in, but Cairn has no account for that e-mail address. Ask your regional lead to add you, using the address your organisation knows you by.',
  },
  'idp-refused': {
    title: 'The sign-in did not finish',
    detail:
      "Your organisation's sign-in page did not complete the sign-in (it may have been cancelled). You can try again.",
  },
  throttled: {
    title: 'Too many sign-in attempts',
    detail:
      'There were too many sign-in attempts from your network in a short time. Wait a minute, then try again.',
  },
  'idp-unavailable': {
    title: "Cairn cannot reach your organisation's sign-in",
    detail: 'Try again in a few minutes. If it keeps happening, tell the Cairn team.',
  },
  'missing-email': incomplete,
  'no-role': incomplete,
  'unknown-practice': incomplete,
  'no-practice': incomplete,
  'no-region': incomplete,
  expired: tooSlow,
  'not-yet-valid': tooSlow,
  'request-expired': tooSlow,
  replayed: startAgain,
  'unknown-request': startAgain,
  unsolicited: startAgain,
};

export function refusalText(code: string): RefusalText {
  return texts[code] ?? notVerified;
}
