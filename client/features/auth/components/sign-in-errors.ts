/**
 * One sentence per reason the server gives when a sign-in ends without a session
 * (server/auth/auth-routes.ts, SignInFailure). Unknown codes get the generic sentence.
 */
const sentences: Record<string, string> = {
  access_denied: "GitHub did not let you in, or the account you asked for does not exist there. Nothing was signed in; try again.",
  state_mismatch: "That sign-in link was stale or had been used already (this protects you from forged sign-ins). Start again from the button below.",
  provider_error: "GitHub could not complete the sign-in just now. Nothing was signed in; try again in a moment.",
  no_code: "The sign-in was not completed. Start again from the button below.",
  bad_login_hint: "That account name is not a valid GitHub login.",
  login_taken: "That login is linked to a different GitHub account here. An admin can sort it out.",
  bad_profile: "GitHub did not say who you are, so you could not be signed in.",
};

export function signInErrorSentence(code: string | null): string | undefined {
  if (!code) return undefined;
  return sentences[code] ?? "The sign-in did not work. Try again.";
}
