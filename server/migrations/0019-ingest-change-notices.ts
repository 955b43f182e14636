import type { MigrationContext } from '../db/umzug';

// Ingest caches what it needs per node (token lookup, radio inventory, network thresholds). Every app process
// listens on one channel, and these triggers tell it, when a change commits, what to forget: whoever made the
// change (this app, another instance, a bulk statement, psql). NOTIFY is delivered only on commit and folds
// repeats within a transaction, so a bulk edit costs one notice per node. Only the columns ingest reads fire, and
// never ingest's own writes (node health and watermark, learned MACs): a transaction that notifies holds a lock
// shared by the whole database from just before its commit until the commit is on disk, so a notice on every
// first report would make a whole town's first reports commit one at a time. Ingest notifies a MAC that moved
// from another node's radio itself (radioMacs.ts), which is rare.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE FUNCTION ingest_cache_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    DECLARE
      notice text;
    BEGIN
      -- Each branch names only its own table's columns (plpgsql resolves a field when its line first runs).
      -- Nodes and tokens fire on UPDATE or DELETE only, so OLD is always there and names the node.
      IF TG_LEVEL = 'STATEMENT' THEN
        notice := TG_ARGV[0];
      ELSIF TG_TABLE_NAME = 'nodes' THEN
        notice := 'node:' || OLD.id;
      ELSIF TG_TABLE_NAME = 'node_tokens' THEN
        notice := 'node:' || OLD.node_id;
      ELSE
        -- radios: a radio moved between nodes changes both nodes' inventories.
        IF TG_OP <> 'INSERT' THEN PERFORM pg_notify('parapet_ingest', 'radios:' || OLD.node_id); END IF;
        IF TG_OP <> 'DELETE' THEN notice := 'radios:' || NEW.node_id; END IF;
      END IF;
      IF notice IS NOT NULL THEN PERFORM pg_notify('parapet_ingest', notice); END IF;
      RETURN NULL;
    END
    $fn$;
    CREATE TRIGGER ingest_cache_tokens AFTER UPDATE OF revoked_at OR DELETE ON node_tokens
      FOR EACH ROW EXECUTE FUNCTION ingest_cache_changed();
    CREATE TRIGGER ingest_cache_nodes AFTER UPDATE OF neighbourhood_id, site_id, report_interval_s, thresholds, firmware OR DELETE ON nodes
      FOR EACH ROW EXECUTE FUNCTION ingest_cache_changed();
    CREATE TRIGGER ingest_cache_sites AFTER UPDATE OF host_user_id OR DELETE ON sites
      FOR EACH STATEMENT EXECUTE FUNCTION ingest_cache_changed('tokens');
    CREATE TRIGGER ingest_cache_radios AFTER INSERT OR DELETE OR UPDATE OF node_id, iface, channel, channel_width_mhz, ssid ON radios
      FOR EACH ROW EXECUTE FUNCTION ingest_cache_changed();
    CREATE TRIGGER ingest_cache_links AFTER INSERT OR DELETE OR UPDATE ON links
      FOR EACH STATEMENT EXECUTE FUNCTION ingest_cache_changed('radios');
    CREATE TRIGGER ingest_cache_thresholds AFTER UPDATE ON network_settings
      FOR EACH STATEMENT EXECUTE FUNCTION ingest_cache_changed('thresholds');
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TRIGGER ingest_cache_tokens ON node_tokens;
    DROP TRIGGER ingest_cache_nodes ON nodes;
    DROP TRIGGER ingest_cache_sites ON sites;
    DROP TRIGGER ingest_cache_radios ON radios;
    DROP TRIGGER ingest_cache_links ON links;
    DROP TRIGGER ingest_cache_thresholds ON network_settings;
    DROP FUNCTION ingest_cache_changed();
  `);
}
