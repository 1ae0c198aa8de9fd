/** The usual cautions for a worn mask, on every buyer page. */
export function MaskSafetyNote({ className = '' }: { className?: string }) {
  return (
    <aside aria-labelledby="mask-safety-title" className={`text-sm leading-relaxed text-ink-soft ${className}`}>
      <h2 id="mask-safety-title" className="mb-1 font-sans text-sm font-semibold text-ink">
        Wearing a mask safely
      </h2>
      <p>
        A mask narrows your view and makes breathing harder. Do not wear it while driving, cycling, climbing
        or playing sport, and take it off if you feel dizzy or short of breath. It is a display and costume
        piece: not a toy for young children, and not protective equipment. Keep it away from heat, candles and
        open flame.
      </p>
    </aside>
  );
}
