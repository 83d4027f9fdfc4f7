// Sign-in and sign-out through Auth.js's own endpoints (CSRF token first, then a form POST).

async function csrf(): Promise<string> {
  const res = await fetch("/auth/csrf", { credentials: "same-origin" });
  const body = (await res.json()) as { csrfToken: string };
  return body.csrfToken;
}

async function postForm(path: string, fields: Record<string, string>): Promise<URL> {
  const form = new URLSearchParams({ ...fields, csrfToken: await csrf() });
  const res = await fetch(path, {
    method: "POST",
    credentials: "same-origin",
    headers: { "Content-Type": "application/x-www-form-urlencoded", "X-Auth-Return-Redirect": "1" },
    body: form,
  });
  if (res.status === 429) {
    const body = (await res.json().catch(() => undefined)) as { error?: { message?: string } } | undefined;
    throw new Error(body?.error?.message ?? "Too many attempts. Wait a while and try again.");
  }
  const body = (await res.json()) as { url: string };
  return new URL(body.url, window.location.origin);
}

export type SignInResult = { ok: true } | { ok: false; message: string };

/** Messages for the error codes Auth.js puts in its redirect URLs. */
export function signInErrorMessage(code: string | null | undefined): string | undefined {
  switch (code) {
    case undefined:
    case null:
    case "":
      return undefined;
    case "CredentialsSignin":
      return "That e-mail and password don't match. Check both and try again.";
    case "Verification":
      return "That sign-in link has expired or was already used. Ask for a new one below.";
    case "AccessDenied":
      return "We could not send a link to that address. Homeowners get links only for the address their installer invited.";
    case "MissingCSRF":
      return "The sign-in form expired. Reload the page and try again.";
    default:
      return "Signing in did not work. Try again in a moment.";
  }
}

export async function signInWithPassword(email: string, password: string): Promise<SignInResult> {
  const url = await postForm("/auth/callback/credentials", { email, password, callbackUrl: "/" });
  const error = url.searchParams.get("error");
  return error ? { ok: false, message: signInErrorMessage(error)! } : { ok: true };
}

export async function requestSignInLink(email: string): Promise<SignInResult> {
  const url = await postForm("/auth/signin/nodemailer", { email, callbackUrl: "/" });
  const error = url.searchParams.get("error");
  return error ? { ok: false, message: signInErrorMessage(error)! } : { ok: true };
}

export async function signOut(): Promise<void> {
  await postForm("/auth/signout", { callbackUrl: "/sign-in" });
}
