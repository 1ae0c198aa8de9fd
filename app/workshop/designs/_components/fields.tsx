import { useId, type InputHTMLAttributes, type ReactNode, type TextareaHTMLAttributes } from 'react';

// One labelled field with its hint and its error, tied together for screen readers: the error is read
// with the field (aria-describedby) and marks it invalid (aria-invalid).

export const inputStyle =
  'w-full rounded-sm border border-paper-edge bg-white px-3 py-2 text-base aria-[invalid]:border-ember aria-[invalid]:ring-1 aria-[invalid]:ring-ember';

type Common = { label: string; hint?: ReactNode; error?: string; className?: string; prefix?: string; suffix?: string };

function useFieldIds() {
  const id = useId();
  return { input: `${id}-input`, hint: `${id}-hint`, error: `${id}-error` };
}

function Frame({
  ids,
  label,
  hint,
  error,
  className = '',
  children,
}: Common & { ids: ReturnType<typeof useFieldIds>; children: ReactNode }) {
  return (
    <div className={`grid content-start gap-1 ${className}`}>
      <label htmlFor={ids.input} className="text-sm font-semibold">
        {label}
      </label>
      {children}
      {hint ? (
        <p id={ids.hint} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      <p id={ids.error} className="min-h-5 text-sm font-semibold text-ember-deep">
        {error ? (
          <>
            <span aria-hidden="true">▲ </span>
            {error}
          </>
        ) : null}
      </p>
    </div>
  );
}

const describedBy = (ids: ReturnType<typeof useFieldIds>, hint: unknown) => (hint ? `${ids.error} ${ids.hint}` : ids.error);

export function TextField({
  label,
  hint,
  error,
  className,
  prefix,
  suffix,
  ...input
}: Common & Omit<InputHTMLAttributes<HTMLInputElement>, 'prefix'> & { name: string }) {
  const ids = useFieldIds();
  const field = (
    <input
      id={ids.input}
      aria-invalid={error ? true : undefined}
      aria-describedby={describedBy(ids, hint)}
      className={`${inputStyle} ${prefix || suffix ? 'min-w-0 flex-1' : ''}`}
      {...input}
    />
  );
  return (
    <Frame ids={ids} label={label} hint={hint} error={error} className={className}>
      {prefix || suffix ? (
        <div className="flex items-center gap-2">
          {prefix ? <span className="text-ink-soft">{prefix}</span> : null}
          {field}
          {suffix ? <span className="text-ink-soft">{suffix}</span> : null}
        </div>
      ) : (
        field
      )}
    </Frame>
  );
}

export function TextArea({ label, hint, error, className, ...input }: Common & TextareaHTMLAttributes<HTMLTextAreaElement> & { name: string }) {
  const ids = useFieldIds();
  return (
    <Frame ids={ids} label={label} hint={hint} error={error} className={className}>
      <textarea
        id={ids.input}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(ids, hint)}
        className={inputStyle}
        {...input}
      />
    </Frame>
  );
}

/** "Unsaved changes", said in words and with a mark, while a form has changes not yet saved. */
export function UnsavedNote({ dirty }: { dirty: boolean }) {
  return (
    <p role="status" className="min-h-6 text-sm font-semibold text-ink-soft">
      {dirty ? (
        <>
          <span aria-hidden="true">● </span>Unsaved changes
        </>
      ) : null}
    </p>
  );
}
