/** The standing notice shown on every page: Emberline is an analysis aid, not a design approval. */
export function SafetyNotice() {
  return (
    <aside aria-label="Safety notice" className="border-t border-paper-line bg-paper-deep">
      <div className="mx-auto max-w-page px-4 py-5 text-sm text-ink-soft">
        <p>
          <strong className="text-ink">Emberline is an analysis aid, not a design approval.</strong> Hot water can burn in
          seconds above 60 °C (140 °F); keep water people touch below 49 °C (120 °F) and spas at or below 40 °C (104 °F).
          Never heat a coil that cannot vent, and keep water flowing until the coil is cold. Fuel-burning equipment makes
          carbon monoxide: run it outdoors, away from openings, with a CO alarm nearby. Electrical equipment near a pool
          needs GFCI protection. Local codes and licensed professionals have the final word.
        </p>
      </div>
    </aside>
  );
}
