// Browser-safe exports only; the PSK derivation (node:crypto) is imported from './psk.node' by the server.
export * from './review';
export * from './strength';
