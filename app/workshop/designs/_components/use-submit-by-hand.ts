'use client';

import { startTransition, useCallback, useRef, type FormEvent } from 'react';

/**
 * Sends a form by hand rather than through its action, so React does not reset the fields: a refused save
 * keeps everything the maker typed. `submitted` holds what was sent last, for `saved()` once it succeeds.
 */
export function useSubmitByHand(dispatch: (data: FormData) => void) {
  const submitted = useRef<FormData | null>(null);
  const onSubmit = useCallback(
    (event: FormEvent<HTMLFormElement>) => {
      event.preventDefault();
      const data = new FormData(event.currentTarget);
      submitted.current = data;
      startTransition(() => dispatch(data));
    },
    [dispatch],
  );
  return { onSubmit, submitted };
}
