import type { NodeState } from '../enums';

/** The public status page: counts and plain words only, no names, places, contacts or keys. */
export interface PublicNeighbourhoodStatus {
  name: string;
  counts: { total: number; up: number; down: number; unknown: number };
  sentence: string;
  availability: { h24Pct: number | null; d30Pct: number | null };
  openOutages: { state: NodeState; since: string; sentence: string }[];
}

export interface PublicStatusDto {
  network: { name: string; timeZone: string };
  generatedAt: string;
  neighbourhoods: PublicNeighbourhoodStatus[];
}
