/** One station of a circuit, as a plan is written (before schema defaults). */
export interface StationInput {
  exercise: string;
  workSeconds: number;
  restSeconds: number;
}

/**
 * Stations that all share one work and one rest length — the usual circuit ("40 s on, 20 s off").
 * Pass names, or a count for stations whose exercises are still to be chosen (left empty).
 */
export function evenStations(exercises: readonly string[] | number, workSeconds: number, restSeconds: number): StationInput[] {
  const names = typeof exercises === 'number' ? Array.from({ length: exercises }, () => '') : exercises;
  return names.map((exercise) => ({ exercise, workSeconds, restSeconds }));
}
