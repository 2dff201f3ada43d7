const DEFAULT_PAGE = '/projects';

/**
 * Where to go after signing in. Only paths inside this app are followed, so
 * a crafted link cannot send a fresh session to another site. Pure.
 */
export function safeReturnUrl(returnUrl: string | null | undefined): string {
  if (!returnUrl || !returnUrl.startsWith('/')) return DEFAULT_PAGE;
  // Browsers drop tabs and line breaks inside URLs, so "/\t/host" would become "//host".
  if (/[\u0000-\u001f\u007f]/.test(returnUrl)) return DEFAULT_PAGE;
  // "//host" and "/\host" are read by browsers as another origin.
  if (returnUrl.startsWith('//') || returnUrl.startsWith('/\\')) return DEFAULT_PAGE;
  if (returnUrl.startsWith('/sign-in')) return DEFAULT_PAGE;
  return returnUrl;
}
