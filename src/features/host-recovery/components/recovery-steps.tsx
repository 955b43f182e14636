import { useEffect, useState } from 'react';
import type { HostStep } from '../../../../shared/health/hostSteps';
import { Button } from '../../../components/button';
import { Caution } from '../../../components/caution';

export interface StepScreen {
  title: string;
  body: string[];
  /** What "done" records for the operators. */
  done: { step: HostStep; note?: string };
  /** What "I can't get to it safely" records. */
  unreachable: string;
  /** Seconds the host should wait in the middle of the step (the injector). */
  waitS?: number;
}

// One step per screen, in the order that finds the usual faults first (common practice, no source).
export const STEPS: StepScreen[] = [
  {
    title: 'Check the power',
    body: [
      'Is the plug of the network box in, and the socket or power strip switched on?',
      'Did anything else in the house lose power? If a breaker tripped, reset it only if you normally do.',
    ],
    done: { step: 'checked-power' },
    unreachable: 'Could not safely reach the power socket',
  },
  {
    title: 'Replug the PoE injector',
    body: [
      'The injector is the small adapter between the mains plug and the network cable.',
      'Pull its mains plug, wait 10 seconds, then plug it back in. Its light should come on.',
    ],
    done: { step: 'replugged-injector' },
    unreachable: 'Could not safely reach the PoE injector',
    waitS: 10,
  },
  {
    title: 'Restart the router',
    body: [
      'If a router indoors feeds the network box, switch it off, wait a few seconds and switch it on again.',
      'It may take two or three minutes to start.',
    ],
    done: { step: 'restarted-router' },
    unreachable: 'Could not safely reach the router',
  },
  {
    title: 'Check the cable',
    body: [
      'Where you can see it from indoors or the ground: is the cable still plugged in at both ends, and not pinched, chewed or loose?',
      'Please do not climb up to look, and do not re-aim the antenna.',
    ],
    done: { step: 'other', note: 'Checked the cable: plugged in and undamaged where visible' },
    unreachable: 'Could not safely see the cable',
  },
];

export function SafetyFirst({ onStart }: { onStart: () => void }) {
  return (
    <section aria-labelledby="safety-title" className="space-y-4">
      <h2 id="safety-title" className="text-2xl font-semibold">
        Before you start
      </h2>
      <Caution title="Safety">
        Do not climb onto the roof or up a ladder, and do not open sockets, power supplies or the PoE injector. Roof and mast work and anything on mains power
        are for people trained or licensed to do it under your local rules. Everything here can be done from indoors or from the ground.
      </Caution>
      <p className="text-lg">Each step takes a minute. Tell us after each one; the volunteers see it straight away.</p>
      <Button variant="primary" className="w-full py-3 text-lg" onClick={onStart}>
        I understand, show the first step
      </Button>
    </section>
  );
}

function WaitButton({ seconds }: { seconds: number }) {
  const [left, setLeft] = useState<number | null>(null);
  useEffect(() => {
    if (left === null || left <= 0) return;
    const timer = window.setTimeout(() => setLeft(left - 1), 1000);
    return () => window.clearTimeout(timer);
  }, [left]);
  if (left === null)
    return (
      <Button className="w-full py-3 text-lg" onClick={() => setLeft(seconds)}>
        Unplugged: start the {seconds} s wait
      </Button>
    );
  return (
    <p role="status" className="rounded-md bg-sunken px-3 py-3 text-center text-lg">
      {left > 0 ? `Wait ${left} s…` : 'Now plug it back in.'}
    </p>
  );
}

export function StepCard({
  index,
  total,
  screen,
  busy,
  onDone,
  onUnreachable,
}: {
  index: number;
  total: number;
  screen: StepScreen;
  busy: boolean;
  onDone: () => void;
  onUnreachable: () => void;
}) {
  return (
    <section aria-labelledby="step-title" className="space-y-4" data-testid="recovery-step">
      <p className="text-base text-muted">
        Step {index + 1} of {total}
      </p>
      <h2 id="step-title" className="text-2xl font-semibold">
        {screen.title}
      </h2>
      {screen.body.map((line) => (
        <p key={line} className="text-lg">
          {line}
        </p>
      ))}
      {screen.waitS && <WaitButton seconds={screen.waitS} />}
      <div className="space-y-2 pt-2">
        <Button variant="primary" className="w-full py-3 text-lg" disabled={busy} onClick={onDone}>
          Done, it is still not back
        </Button>
        <Button className="w-full py-3 text-lg" disabled={busy} onClick={onUnreachable}>
          I can’t get to it safely
        </Button>
      </div>
    </section>
  );
}
