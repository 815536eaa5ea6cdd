// Canonical movements: the same body movement carries different exercise keys in different
// protocols ("bending-over" in the standard protocol, "bending" in the shortened ones), so
// insights count exercises by movement. Data, not code: a custom protocol's key maps here when it
// matches, else it keeps its own key as its movement.

export const CANONICAL_MOVEMENTS = [
  'normal-breathing',
  'deep-breathing',
  'head-side-to-side',
  'head-up-and-down',
  'talking',
  'grimace',
  'bending',
  'jogging'
] as const
export type CanonicalMovement = typeof CANONICAL_MOVEMENTS[number]

export const MOVEMENT_LABELS: Record<CanonicalMovement, string> = {
  'normal-breathing': 'Normal breathing',
  'deep-breathing': 'Deep breathing',
  'head-side-to-side': 'Head side to side',
  'head-up-and-down': 'Head up and down',
  'talking': 'Talking',
  'grimace': 'Grimace',
  'bending': 'Bending',
  'jogging': 'Jogging in place'
}

/** Exercise key (built-in protocols of 29 CFR 1910.134 App. A, Part I.A.14, I.C.4, I.C.5) → movement. */
export const EXERCISE_MOVEMENTS: Readonly<Record<string, CanonicalMovement>> = {
  'normal-breathing-start': 'normal-breathing',
  'normal-breathing-end': 'normal-breathing',
  'normal-breathing': 'normal-breathing',
  'deep-breathing': 'deep-breathing',
  'head-side-to-side': 'head-side-to-side',
  'head-up-and-down': 'head-up-and-down',
  'talking': 'talking',
  'grimace': 'grimace',
  'bending-over': 'bending',
  'bending': 'bending',
  'jogging-in-place': 'jogging',
  'jogging': 'jogging'
}

/** The movement an exercise key counts under; an unknown (custom) key is its own movement. */
export function canonicalMovement(exerciseKey: string): string {
  return EXERCISE_MOVEMENTS[exerciseKey] ?? exerciseKey
}

/** A label for a movement; a custom key is shown as written. */
export function movementLabel(movement: string): string {
  return (MOVEMENT_LABELS as Record<string, string>)[movement] ?? movement
}
