// Who does a step and who checks it, in the words the step table, the chart and placekeeping print. The kinds
// of verification are the trade's (DOE-STD-1029 and HSE HSG48 describe independent verification, peer checks and
// second-person sign-off); the labels are our own.

const verifyLabels: Record<string, string> = {
  independent: 'Independent verification',
  'peer-check': 'Peer check',
  'second-person': 'Second-person sign-off',
};

/** "Independent verification", "Peer check", "Second-person sign-off"; an unknown kind as written. */
export function verifyLabel(kind: string): string {
  return verifyLabels[kind] ?? kind;
}

/** One line for the chart: "PEER CHECK: Second field operator". */
export function verifyMarker(verify: { kind: string; role: string }): string {
  return `${verifyLabel(verify.kind).toUpperCase()}: ${verify.role}`;
}

/** One line for the chart: "BY: Board operator". */
export function performerMarker(performer: string): string {
  return `BY: ${performer}`;
}
