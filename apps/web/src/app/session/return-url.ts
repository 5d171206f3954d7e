/** Only same-site paths are followed after sign-in (never `//host` or `https://…`). */
export function safeReturnUrl(value: string | null | undefined): string {
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/sign-in')) {
    return '/';
  }
  return value;
}

/** A return URL the registration API carries through its e-mailed link (a plain same-site path). */
export function registrationReturnUrl(value: string | null | undefined): string | undefined {
  const safe = safeReturnUrl(value);
  return safe !== '/' && /^\/(?!\/)[A-Za-z0-9._~\-/]*$/.test(safe) && safe.length <= 300
    ? safe
    : undefined;
}
