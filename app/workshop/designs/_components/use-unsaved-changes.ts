'use client';

import { useCallback, useEffect, useId, useRef, useState } from 'react';

// Every form on the page with changes not yet saved. One set of listeners serves them all, so leaving a
// page with three edited forms asks once.
const dirtyForms = new Set<string>();

function onBeforeUnload(event: BeforeUnloadEvent) {
  event.preventDefault();
  // Older browsers show the prompt only when returnValue is set.
  event.returnValue = '';
}

// Links inside the app navigate without unloading the page, so beforeunload alone would not catch them.
function onLinkClick(event: MouseEvent) {
  if (event.defaultPrevented || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return;
  const link = (event.target as Element | null)?.closest?.('a[href]');
  if (!(link instanceof HTMLAnchorElement) || link.target === '_blank' || link.hasAttribute('download')) return;
  const to = new URL(link.href, window.location.href);
  if (to.pathname === window.location.pathname && to.search === window.location.search) return;
  if (!window.confirm('You have unsaved changes on this page. Leave without saving them?')) {
    event.preventDefault();
    event.stopPropagation();
  }
}

function setDirty(key: string, dirty: boolean) {
  const before = dirtyForms.size;
  if (dirty) dirtyForms.add(key);
  else dirtyForms.delete(key);
  if (before === 0 && dirtyForms.size > 0) {
    window.addEventListener('beforeunload', onBeforeUnload);
    document.addEventListener('click', onLinkClick, true);
  } else if (before > 0 && dirtyForms.size === 0) {
    window.removeEventListener('beforeunload', onBeforeUnload);
    document.removeEventListener('click', onLinkClick, true);
  }
}

const snapshot = (data: FormData) =>
  JSON.stringify([...data.entries()].filter(([, value]) => typeof value === 'string'));

/**
 * Tracks whether a form differs from what was last loaded or saved. Put `formRef` and `onChange` on the
 * form, show "Unsaved changes" while `dirty`, and call `saved(formData)` when a save succeeds.
 */
export function useUnsavedChanges() {
  const key = useId();
  const formRef = useRef<HTMLFormElement>(null);
  const baseline = useRef<string | null>(null);
  const [dirty, setDirtyState] = useState(false);

  const read = useCallback(() => (formRef.current ? snapshot(new FormData(formRef.current)) : ''), []);

  useEffect(() => {
    baseline.current = read();
    return () => setDirty(key, false);
  }, [key, read]);

  const onChange = useCallback(() => {
    const now = read() !== baseline.current;
    setDirtyState(now);
    setDirty(key, now);
  }, [key, read]);

  const saved = useCallback(
    (submitted: FormData) => {
      baseline.current = snapshot(submitted);
      onChange();
    },
    [onChange],
  );

  return { formRef, dirty, onChange, saved };
}
