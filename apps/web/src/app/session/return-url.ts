/** Only same-site paths are followed after sign-in (never `//host` or `https://…`). */
export function safeReturnUrl(value: string | null | undefined): string {
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/sign-in')) {
    return '/';
  }
  return value;
}
