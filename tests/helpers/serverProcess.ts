// Tests start real server processes the same way the benchmark scripts do.
export * from '../../server/tools/serverProcess';
