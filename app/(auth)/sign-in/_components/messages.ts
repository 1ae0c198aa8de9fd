// What each way of arriving at the sign-in page with a problem means, in words a person can act on.
export const signInProblems: Record<string, string> = {
  link_used: 'This sign-in link has already been used. Each link works once: ask for a new one below.',
  link_expired: 'This sign-in link has expired. Ask for a new one below; it arrives within a minute.',
  link_invalid:
    'This sign-in link is not valid. It may have been cut short when it was copied: ask for a new one below.',
  Verification: 'This sign-in link has expired or has already been used. Ask for a new one below.',
  EmailSignin: 'We could not send the sign-in e-mail just now. Please try again in a minute.',
  SessionRequired: 'Sign in to see that page.',
};

export const defaultSignInProblem = 'Signing in did not work. Please try again.';
