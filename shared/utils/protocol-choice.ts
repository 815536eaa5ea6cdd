// The set-up form's first protocol choice, apart from the fit-test arithmetic (fit-test-evaluate.ts)
// so the form does not load the computation module and its statistics library with it.

/**
 * The protocol offered first for a respirator class: the shortened protocol that 29 CFR 1910.134
 * App. A Part I.C.4 / I.C.5 allow for that facepiece under US OSHA rules, else the standard one.
 */
export function defaultProtocolKeyFor(respiratorClass: string, ruleSet: string): string {
  if (ruleSet !== 'us-osha') return 'osha-standard'
  if (respiratorClass === 'filtering-facepiece') return 'osha-modified-filtering-facepiece'
  if (respiratorClass === 'elastomeric-half-mask' || respiratorClass === 'elastomeric-full-facepiece') return 'osha-modified-elastomeric'
  return 'osha-standard'
}
