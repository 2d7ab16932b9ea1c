import { Navigate, useNavigate, useSearchParams } from "react-router";
import { signInSchema, type SignIn } from "../../../shared/schemas/auth";
import { ApiError } from "../../api/http";
import { SkipLink } from "../../app/AppLayout";
import { useDocumentTitle } from "../../app/RouteGuard";
import { useRouteTable } from "../../app/RouteTable";
import { Button } from "../../components/Button";
import { FormField } from "../../components/FormField";
import { FormShell } from "../../components/FormShell";
import { Logo } from "../../components/Logo";
import { Notice } from "../../components/Notice";
import { LoadingState } from "../../components/States";
import { useSignIn } from "./mutations";
import { useSession } from "./useSession";
import { safeNextPath } from "../../lib/safeNext";
import { FORM_ERROR, showServerError, useSchemaForm } from "../../lib/useSchemaForm";

/** One message for every wrong e-mail/password combination, so the form does not reveal which accounts exist. */
export const wrongCredentialsMessage = "That e-mail address and password do not match an active account. Check both and try again.";

function rateLimitMessage(error: ApiError): string {
  const details = error.details as { retryAfterSeconds?: unknown } | undefined;
  const seconds = typeof details?.retryAfterSeconds === "number" ? details.retryAfterSeconds : null;
  const wait = seconds ? `about ${Math.max(1, Math.ceil(seconds / 60))} minute${seconds > 60 ? "s" : ""}` : "a few minutes";
  return `Too many sign-in attempts from here. For your account's safety, sign-in is paused: wait ${wait}, then try again.`;
}

export default function SignInPage() {
  useDocumentTitle("Sign in");
  const session = useSession();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const form = useSchemaForm(signInSchema, { email: "", password: "" });
  const problem = form.formState.errors.root?.server?.message;
  const next = safeNextPath(params.get("next"));
  const { homePathFor } = useRouteTable();

  if (session.isPending) return <LoadingState label="Checking your session…" />;
  if (session.data && !signIn.isPending && !signIn.isSuccess) {
    return <Navigate to={next ?? homePathFor(session.data.user.role)} replace />;
  }

  function submit(credentials: SignIn) {
    const say = (message: string) => form.setError(FORM_ERROR, { type: "server", message });
    signIn.mutate(credentials, {
      onSuccess: (answer) => navigate(next ?? homePathFor(answer.user.role), { replace: true }),
      onError: (error) => {
        if (error instanceof ApiError && error.status === 401) say(wrongCredentialsMessage);
        else if (error instanceof ApiError && error.status === 429) say(rateLimitMessage(error));
        else if (error instanceof ApiError && error.status === 422) showServerError(form, error);
        else if (error instanceof ApiError) say(error.message);
        else say("Quarterbeat could not be reached. Check the connection and try again.");
      },
    });
  }

  return (
    <div className="flex min-h-screen flex-col items-center bg-paper px-4 py-10 sm:py-16">
      <SkipLink />
      <main id="main" tabIndex={-1} className="w-full max-w-md outline-none">
        <div className="mb-8 flex justify-center">
          <Logo tone="onLight" size="lg" />
        </div>
        <div className="rounded-card border border-line bg-surface p-6 shadow-card sm:p-8">
          <h1 className="text-headline">Sign in</h1>
          <p className="mt-1 mb-6 text-muted">CPR training quality for your network.</p>
          {next && !problem && (
            <Notice tone="info" className="mb-4">
              Sign in to continue to the page you asked for.
            </Notice>
          )}
          <FormShell form={form} onValid={submit}>
            <FormField label="E-mail address" name="email" type="email" autoComplete="username" inputMode="email" spellCheck={false} />
            <FormField label="Password" name="password" type="password" autoComplete="current-password" />
            <Button type="submit" busy={signIn.isPending} className="mt-2 w-full">
              {signIn.isPending ? "Signing in…" : "Sign in"}
            </Button>
          </FormShell>
          <p className="mt-6 text-small text-muted">Forgotten your password? Ask your regional coordinator to set a temporary one.</p>
        </div>
        <p className="mt-6 text-center text-caption text-muted">Quarterbeat is a training-quality tool, not a medical device.</p>
      </main>
    </div>
  );
}
