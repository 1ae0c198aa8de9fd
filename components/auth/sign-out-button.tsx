'use client';

import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { postAuthForm } from '@/lib/api/client';

export function SignOutButton({ className = '' }: { className?: string }) {
  const router = useRouter();
  const signOut = useMutation({
    mutationFn: () => postAuthForm('/api/auth/signout', { callbackUrl: '/' }),
    onSuccess: () => {
      router.replace('/');
      router.refresh();
    },
  });
  return (
    <button type="button" onClick={() => signOut.mutate()} disabled={signOut.isPending} className={className}>
      {signOut.isPending ? 'Signing out…' : signOut.isError ? 'Try signing out again' : 'Sign out'}
    </button>
  );
}
