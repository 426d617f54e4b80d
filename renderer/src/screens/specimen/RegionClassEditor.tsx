import { useEffect, useState } from 'react';
import type { RegionSummary, SurfaceClassName } from '../../viewer/mesh-payload';

/** The surface classes in the analyst's words, in the order offered. */
export const SURFACE_CLASS_LABELS: Array<{ value: SurfaceClassName; label: string }> = [
  { value: 'fracture', label: 'Fracture face' },
  { value: 'outer-cortical', label: 'Outer cortical surface' },
  { value: 'medullary', label: 'Medullary surface' },
  { value: 'articular', label: 'Articular surface' },
];

export function surfaceClassLabel(c: string | null | undefined): string {
  return SURFACE_CLASS_LABELS.find((x) => x.value === c)?.label.toLowerCase() ?? "the program's class";
}

/**
 * Correct the class of one surface region: choose a class and record it (every correction is
 * kept; the newest is in force), or withdraw the correction so the program's class applies.
 */
export function RegionClassEditor(props: {
  region: RegionSummary;
  correctable: boolean;
  busy: boolean;
  onCorrect: (surfaceClass: SurfaceClassName | null) => void;
}) {
  const { region } = props;
  const [choice, setChoice] = useState<SurfaceClassName>(region.surfaceClass);
  useEffect(() => setChoice(region.surfaceClass), [region.id, region.surfaceClass]);
  const name = `region-class-${region.id}`;
  return (
    <form
      className="region-editor"
      aria-label={`Class of region ${region.id}`}
      onSubmit={(e) => {
        e.preventDefault();
        if (choice !== region.surfaceClass) props.onCorrect(choice);
      }}
    >
      <fieldset disabled={!props.correctable || props.busy}>
        <legend>
          Region {region.id}: {surfaceClassLabel(region.surfaceClass)}
          {region.corrected ? ' (corrected by hand)' : ''}, {region.area.toFixed(1)} mm²
        </legend>
        {SURFACE_CLASS_LABELS.map((c) => (
          <label key={c.value}>
            <input type="radio" name={name} value={c.value} checked={choice === c.value} onChange={() => setChoice(c.value)} />
            {c.label}
          </label>
        ))}
        <div className="region-actions">
          <button type="submit" className="primary" disabled={choice === region.surfaceClass}>
            Record correction
          </button>
          {region.corrected && (
            <button type="button" onClick={() => props.onCorrect(null)}>
              Withdraw correction
            </button>
          )}
        </div>
      </fieldset>
      {!props.correctable && <p className="hint">This scan was linked without its regions being stored; import it again to correct its classes.</p>}
    </form>
  );
}
