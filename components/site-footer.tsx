import { MaskSafetyNote } from './mask-safety-note';

export function SiteFooter() {
  return (
    <footer className="mt-24 border-t border-paper-edge/70 bg-paper-deep/60">
      <div className="mx-auto grid max-w-gallery gap-8 px-5 py-10 sm:grid-cols-[2fr_1fr] sm:px-8">
        <MaskSafetyNote />
        <p className="text-sm text-ink-faint sm:text-right">
          Every mask is sculpted, cast and painted by hand in small batches.
        </p>
      </div>
    </footer>
  );
}
