// The kinds of procedure, on their own so that the command line's help can name them without loading the schema.
export const kinds = [
  'normal', 'batch', 'startup', 'startup-after-turnaround', 'shutdown', 'emergency-shutdown', 'emergency', 'temporary',
] as const;
