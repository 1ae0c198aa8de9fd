import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { demoPersonList } from '@/lib/auth/demo';
import { signInPageSearchSchema } from '@/lib/auth/schemas';
import { getCurrentUser } from '@/lib/auth/session';
import { getEnv } from '@/lib/env';
import { DemoSignIn } from './_components/demo-sign-in';
import { defaultSignInProblem, signInProblems } from './_components/messages';
import { SignInForm } from './_components/sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

export default async function SignInPage({ searchParams }: Props) {
  const { error, callbackUrl, email } = signInPageSearchSchema.parse(await searchParams);
  const user = await getCurrentUser();
  if (user && !error) redirect(callbackUrl ?? '/account');

  const problem = error ? (signInProblems[error] ?? defaultSignInProblem) : null;
  return (
    <>
      <h1 className="text-4xl font-medium">Sign in</h1>
      <p className="mt-2 text-ink-soft">
        No password: we e-mail you a link that signs you in. You need to be signed in to hold a mask in a drop.
      </p>
      {problem ? (
        <p role="alert" className="mt-6 rounded-sm border border-ember/40 bg-ember-wash p-4 text-ember-deep">
          {problem}
        </p>
      ) : null}
      <div className="mt-8">
        <SignInForm callbackUrl={callbackUrl ?? '/'} initialEmail={email} />
      </div>
      {getEnv().DEMO_MODE ? <DemoSignIn people={demoPersonList} callbackUrl={callbackUrl} /> : null}
    </>
  );
}
