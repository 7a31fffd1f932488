/** Where to send someone to sign in and come back to the page they were on. */
export function signInUrl(returnTo = `${window.location.pathname}${window.location.search}`) {
  return `/auth/login?returnTo=${encodeURIComponent(returnTo)}`;
}
