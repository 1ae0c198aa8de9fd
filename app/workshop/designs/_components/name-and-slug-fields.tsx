'use client';

import { useState, type ReactNode } from 'react';
import { slugify } from '@/lib/catalogue/slug';
import { TextField } from './fields';

type Props = {
  name: string;
  slug: string;
  /** A new design's or finish's slug follows its name until the maker types one of their own. */
  slugFollowsName: boolean;
  /** What stands before the slug in the address, such as /designs/. */
  slugPrefix: string;
  slugHint: ReactNode;
  errors: { name?: string; slug?: string };
};

/** The name and slug fields of a design or finish form, the slug made from the name the way the server makes it. */
export function NameAndSlugFields({
  name,
  slug: initialSlug,
  slugFollowsName: follows,
  slugPrefix,
  slugHint,
  errors,
}: Props) {
  const [slug, setSlug] = useState(initialSlug);
  const [slugFollowsName, setSlugFollowsName] = useState(follows);
  return (
    <>
      <TextField
        label="Name"
        name="name"
        defaultValue={name}
        required
        maxLength={80}
        autoComplete="off"
        error={errors.name}
        onChange={(event) => {
          if (slugFollowsName) setSlug(slugify(event.target.value));
        }}
      />
      <TextField
        label="Slug"
        name="slug"
        value={slug}
        onChange={(event) => {
          setSlug(event.target.value);
          setSlugFollowsName(false);
        }}
        maxLength={80}
        autoComplete="off"
        autoCapitalize="none"
        spellCheck={false}
        prefix={slugPrefix}
        hint={slugHint}
        error={errors.slug}
      />
    </>
  );
}
