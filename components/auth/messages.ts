/** What the sign-in page says for each `?error=` next-auth may redirect with. */
export const SIGN_IN_ERRORS: Record<string, string> = {
  CredentialsSignin: "The e-mail or password is not right, or the account is not active.",
  RateLimited:
    "Too many failed sign-ins for this account or from this network. Wait 15 minutes, or reset your password by e-mail.",
  SessionRequired: "Sign in to open that page.",
  Default: "Signing in did not work. Try again.",
};

export function signInErrorText(code: string | null | undefined): string | null {
  if (!code) return null;
  return SIGN_IN_ERRORS[code] ?? SIGN_IN_ERRORS.Default;
}
