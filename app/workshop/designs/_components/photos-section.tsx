'use client';

import Image from 'next/image';
import { startTransition, useActionState, useEffect, useRef, useState, type FormEvent } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import type { PhotoEditView } from '@/lib/catalogue/editing';
import { deletePhotoAction, movePhotoAction, updatePhotoAltAction } from '../actions';
import { TextArea, UnsavedNote } from './fields';
import { focusFirstInvalid } from './form-state';
import { useUnsavedChanges } from './use-unsaved-changes';

export type PhotoGroup = { key: string; title: string; photos: PhotoEditView[] };

/**
 * A design's photos, its own and each finish's, with their descriptions (alt text), order and deletion.
 * The first photo of a group is the one shown first: the design's cover, or the finish's first picture.
 */
export function PhotoGroups({ groups, editable }: { groups: PhotoGroup[]; editable: boolean }) {
  return (
    <div className="grid gap-6">
      {groups.map((group) => (
        <PhotoGroupList key={group.key} group={group} editable={editable} />
      ))}
    </div>
  );
}

function PhotoGroupList({ group, editable }: { group: PhotoGroup; editable: boolean }) {
  const headingRef = useRef<HTMLHeadingElement>(null);
  const [deleted, deletePhoto, deleting] = useActionState(deletePhotoAction, null);
  useEffect(() => {
    // The deleted photo's buttons are gone: keep the keyboard in the same list.
    if (deleted?.ok) headingRef.current?.focus();
  }, [deleted]);
  const headingId = `photos-${group.key}`;
  return (
    <section aria-labelledby={headingId} className="grid gap-2">
      <h3 id={headingId} ref={headingRef} tabIndex={-1} className="font-sans text-base font-semibold">
        {group.title} <span className="font-normal text-ink-soft">· {group.photos.length === 1 ? '1 photo' : `${group.photos.length} photos`}</span>
      </h3>
      <FormStatus state={deleted} />
      {group.photos.length === 0 ? (
        <p className="rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm text-ink-soft">No photos here yet.</p>
      ) : (
        <ol className="grid gap-3">
          {group.photos.map((photo, index) => (
            <li key={photo.id}>
              <PhotoItem
                photo={photo}
                place={`${index + 1} of ${group.photos.length}`}
                first={index === 0}
                last={index === group.photos.length - 1}
                editable={editable}
                groupTitle={group.title}
                onDelete={deletePhoto}
                deleting={deleting}
              />
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

type ItemProps = {
  photo: PhotoEditView;
  place: string;
  first: boolean;
  last: boolean;
  editable: boolean;
  groupTitle: string;
  onDelete: (data: FormData) => void;
  deleting: boolean;
};

function PhotoItem({ photo, place, first, last, editable, groupTitle, onDelete, deleting }: ItemProps) {
  return (
    <div className="grid gap-3 rounded-sm border border-paper-edge bg-paper p-3 sm:grid-cols-[6rem_1fr_auto]">
      <div className="relative aspect-[4/5] w-24 overflow-hidden rounded-sm bg-paper-deep">
        {/* Its description is written out beside it, so it is not read twice. */}
        <Image src={photo.src} alt="" fill sizes="6rem" className="object-cover" />
      </div>
      {editable ? (
        <>
          <AltForm photo={photo} place={place} />
          <div className="grid content-start gap-2">
            <MoveButtons photo={photo} place={place} first={first} last={last} groupTitle={groupTitle} />
            <form
              action={onDelete}
              onSubmit={(event) => {
                if (!window.confirm(`Delete photo ${place} of ${groupTitle}? This cannot be undone.`)) event.preventDefault();
              }}
            >
              <input type="hidden" name="photoId" value={photo.id} />
              <button
                type="submit"
                disabled={deleting}
                className="rounded-full border border-ember/50 px-4 py-1.5 text-sm text-ember-deep hover:border-ember disabled:opacity-60"
              >
                Delete<span className="sr-only"> photo {place}</span>
              </button>
            </form>
          </div>
        </>
      ) : (
        <div className="text-sm">
          <p className="font-semibold">Photo {place}</p>
          <p className="text-ink-soft">{photo.alt}</p>
        </div>
      )}
    </div>
  );
}

function AltForm({ photo, place }: { photo: PhotoEditView; place: string }) {
  const [state, dispatch, pending] = useActionState(updatePhotoAltAction, null);
  const { formRef, dirty, onChange, saved } = useUnsavedChanges();
  const submitted = useRef<FormData | null>(null);
  const [length, setLength] = useState(photo.alt.length);

  useEffect(() => {
    if (!state) return;
    if (state.ok && submitted.current) saved(submitted.current);
    else if (!state.ok) focusFirstInvalid(formRef.current);
  }, [state, saved, formRef]);

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    submitted.current = data;
    startTransition(() => dispatch(data));
  }

  return (
    <form ref={formRef} onSubmit={onSubmit} onChange={onChange} noValidate className="grid content-start gap-1">
      <input type="hidden" name="photoId" value={photo.id} />
      <TextArea
        label={`Description of photo ${place} (alt text)`}
        name="alt"
        defaultValue={photo.alt}
        rows={2}
        maxLength={300}
        required
        onInput={(event) => setLength(event.currentTarget.value.length)}
        hint={`What the photo shows, for people who cannot see it. ${length}/300 characters.`}
        error={fieldError(state, 'alt') ?? fieldError(state, 'photoId')}
      />
      <div className="flex flex-wrap items-center gap-x-3">
        <button
          type="submit"
          disabled={pending}
          className="rounded-full border border-ink px-4 py-1.5 text-sm font-semibold hover:bg-ink hover:text-paper disabled:opacity-60"
        >
          {pending ? 'Saving…' : 'Save description'}
        </button>
        <UnsavedNote dirty={dirty && !pending} />
      </div>
      <FormStatus state={state && !state.ok && state.error.fieldErrors ? null : state} />
    </form>
  );
}

function MoveButtons({ photo, place, first, last, groupTitle }: { photo: PhotoEditView; place: string; first: boolean; last: boolean; groupTitle: string }) {
  const [state, dispatch, pending] = useActionState(movePhotoAction, null);
  const pressed = useRef<HTMLButtonElement | null>(null);
  useEffect(() => {
    // The list is drawn again in its new order; the keyboard stays on the button just used.
    // At the end of the list that button is now disabled: the other one takes the focus.
    const target = pressed.current;
    if (!state?.ok || !target) return;
    if (target.disabled) target.parentElement?.querySelector<HTMLButtonElement>('button:not(:disabled)')?.focus();
    else target.focus();
  }, [state]);
  const button = 'rounded-full border border-paper-edge px-3 py-1.5 text-sm hover:border-ink disabled:opacity-40';
  return (
    <form action={dispatch} className="grid gap-1">
      <input type="hidden" name="photoId" value={photo.id} />
      <div className="flex gap-2">
        <button
          type="submit"
          name="direction"
          value="up"
          disabled={pending || first}
          onClick={(event) => (pressed.current = event.currentTarget)}
          className={button}
          aria-label={`Move photo ${place} of ${groupTitle} up`}
        >
          <span aria-hidden="true">↑</span> Up
        </button>
        <button
          type="submit"
          name="direction"
          value="down"
          disabled={pending || last}
          onClick={(event) => (pressed.current = event.currentTarget)}
          className={button}
          aria-label={`Move photo ${place} of ${groupTitle} down`}
        >
          <span aria-hidden="true">↓</span> Down
        </button>
      </div>
      <FormStatus state={state} />
    </form>
  );
}
