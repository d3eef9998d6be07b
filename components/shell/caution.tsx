import { CAUTION_TEXT, CAUTION_TITLE } from "@/lib/caution";

/** Shown on every page (root layout), signed in or not. */
export function Caution() {
  return (
    <aside
      aria-label="Caution"
      data-testid="caution"
      className="border-b border-ember-200 bg-ember-50 px-4 py-1.5 text-xs leading-snug text-ink-700 sm:px-6"
    >
      <p className="mx-auto max-w-[96rem]">
        <strong className="font-semibold text-ember-700">{CAUTION_TITLE}.</strong> {CAUTION_TEXT}
      </p>
    </aside>
  );
}
