import { Caution } from '../../../components/caution';

/** The caution every planning page carries: plans lead to climbs, wiring and transmitters. */
export function PlanningCaution() {
  return (
    <div className="mt-6" data-testid="planning-caution">
      <Caution title="Before anyone climbs">
        Roof and mast work can kill: never climb alone, use fall protection and keep clear of power lines. Mains and PoE wiring follows local electrical code.
        Stay out of the beam of high-gain antennas while they transmit (RF exposure). Channel and power figures here are guidance: local codes, the regulator
        and licensed practice decide.
      </Caution>
    </div>
  );
}
