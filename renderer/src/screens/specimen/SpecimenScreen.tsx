export function SpecimenScreen({ specimenId }: { specimenId: number | null }) {
  return <p className="empty">Not yet {specimenId}.</p>;
}
