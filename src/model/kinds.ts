// The kinds of procedure, on their own so that the command line's help can name them without loading the schema.
export const kinds = [
  'normal', 'batch', 'startup', 'startup-after-turnaround', 'shutdown', 'emergency-shutdown', 'emergency', 'temporary',
] as const;

/** Procedures for an emergency: they start with the plant possibly tripped, and the operator acts before reading. */
export const emergencyKinds: ReadonlySet<string> = new Set(['emergency', 'emergency-shutdown']);

/** Procedures that stop the plant: signals falling through their low trips, and trips left latched, are what they do. */
export const stoppingKinds: ReadonlySet<string> = new Set(['shutdown', 'emergency-shutdown', 'emergency']);
