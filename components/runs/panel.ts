/** The card look of components/ui/card.tsx, for the run view's <section> panels. */
export const PANEL = "rounded-[var(--radius-card)] border border-line bg-surface shadow-[var(--shadow-card)]";
