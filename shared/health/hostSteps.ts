// What a host can tell the operators they did while their node was down, and how it reads in the outage's timeline.
export const HOST_STEPS = ['checked-power', 'replugged-injector', 'restarted-router', 'cannot-reach', 'other'] as const;
export type HostStep = (typeof HOST_STEPS)[number];

const SAID: Record<HostStep, string> = {
  'checked-power': 'checked the power',
  'replugged-injector': 'unplugged the PoE injector, waited 10 s and plugged it back in',
  'restarted-router': 'restarted the router',
  'cannot-reach': 'could not fix it or could not safely reach the equipment',
  other: 'did something else',
};

/** One line for operators: "Ada (host) restarted the router: the lights came back". */
export function hostStepText(step: HostStep, who: string, note?: string | null): string {
  const detail = note?.trim();
  if (step === 'other' && detail) return `${who} ${detail.charAt(0).toLowerCase()}${detail.slice(1)}`;
  return detail ? `${who} ${SAID[step]}: ${detail}` : `${who} ${SAID[step]}`;
}
