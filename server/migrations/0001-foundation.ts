import type { MigrationContext } from '../db/umzug';

// The inventory, people and sessions. Constraints live in the database, not only in zod.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE users (
      id serial PRIMARY KEY,
      email text NOT NULL CHECK (email = lower(email) AND email LIKE '%_@_%' AND length(email) <= 254),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      role text NOT NULL CHECK (role IN ('admin', 'operator', 'host')),
      password_hash text,
      phone text CHECK (length(phone) <= 40),
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX users_email_key ON users (email);

    CREATE TABLE neighbourhoods (
      id serial PRIMARY KEY,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      description text,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX neighbourhoods_name_key ON neighbourhoods (lower(name));

    CREATE TABLE operator_assignments (
      user_id integer NOT NULL REFERENCES users (id) ON DELETE CASCADE,
      neighbourhood_id integer NOT NULL REFERENCES neighbourhoods (id) ON DELETE CASCADE,
      created_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (user_id, neighbourhood_id)
    );
    CREATE INDEX operator_assignments_neighbourhood_idx ON operator_assignments (neighbourhood_id);

    CREATE TABLE sites (
      id serial PRIMARY KEY,
      neighbourhood_id integer NOT NULL REFERENCES neighbourhoods (id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      latitude double precision NOT NULL CHECK (latitude BETWEEN -90 AND 90),
      longitude double precision NOT NULL CHECK (longitude BETWEEN -180 AND 180),
      ground_elevation_m double precision NOT NULL DEFAULT 0 CHECK (ground_elevation_m BETWEEN -450 AND 9000),
      antenna_height_m double precision NOT NULL DEFAULT 0 CHECK (antenna_height_m BETWEEN 0 AND 300),
      access_notes text CHECK (length(access_notes) <= 2000),
      host_user_id integer REFERENCES users (id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX sites_name_key ON sites (neighbourhood_id, lower(name));
    CREATE INDEX sites_host_idx ON sites (host_user_id);

    CREATE TABLE nodes (
      id serial PRIMARY KEY,
      site_id integer NOT NULL REFERENCES sites (id) ON DELETE RESTRICT,
      neighbourhood_id integer NOT NULL REFERENCES neighbourhoods (id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      hardware text CHECK (length(hardware) <= 120),
      firmware text CHECK (length(firmware) <= 120),
      management_address inet,
      report_interval_s integer NOT NULL DEFAULT 60 CHECK (report_interval_s BETWEEN 10 AND 3600),
      is_uplink boolean NOT NULL DEFAULT false,
      state text NOT NULL DEFAULT 'unknown'
        CHECK (state IN ('online', 'degraded', 'offline', 'maintenance', 'unknown', 'stranded')),
      state_since timestamptz,
      last_seen_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX nodes_name_key ON nodes (lower(name));
    CREATE INDEX nodes_site_idx ON nodes (site_id);
    CREATE INDEX nodes_neighbourhood_state_idx ON nodes (neighbourhood_id, state);

    CREATE TABLE radios (
      id serial PRIMARY KEY,
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      iface text NOT NULL CHECK (iface ~ '^[A-Za-z0-9._-]{1,15}$'),
      band text NOT NULL CHECK (band IN ('2.4', '5')),
      channel integer NOT NULL CHECK (
        (band = '2.4' AND channel BETWEEN 1 AND 14) OR (band = '5' AND channel BETWEEN 32 AND 196)),
      channel_width_mhz integer NOT NULL CHECK (channel_width_mhz IN (20, 40, 80)),
      tx_power_dbm double precision NOT NULL CHECK (tx_power_dbm BETWEEN -10 AND 36),
      antenna_gain_dbi double precision NOT NULL CHECK (antenna_gain_dbi BETWEEN -10 AND 45),
      polarisation text NOT NULL DEFAULT 'vertical' CHECK (polarisation IN ('vertical', 'horizontal', 'dual', 'circular')),
      cable_loss_db double precision NOT NULL DEFAULT 0 CHECK (cable_loss_db BETWEEN 0 AND 30),
      role text NOT NULL CHECK (role IN ('access-point', 'backhaul-client', 'backhaul-ap', 'mesh')),
      ssid text CHECK (octet_length(ssid) <= 32),
      encryption text NOT NULL CHECK (encryption IN ('none', 'wep', 'wpa-tkip', 'wpa2-ccmp', 'wpa3-sae')),
      pre_shared_key text CHECK (pre_shared_key ~ '^[ -~]{8,63}$' OR pre_shared_key ~ '^[0-9A-Fa-f]{64}$'),
      group_rekey_s integer NOT NULL DEFAULT 600 CHECK (group_rekey_s BETWEEN 0 AND 604800),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX radios_iface_key ON radios (node_id, iface);

    CREATE TABLE links (
      id serial PRIMARY KEY,
      name text CHECK (length(name) BETWEEN 1 AND 120),
      radio_a_id integer NOT NULL REFERENCES radios (id) ON DELETE CASCADE,
      radio_b_id integer NOT NULL REFERENCES radios (id) ON DELETE CASCADE,
      status text NOT NULL DEFAULT 'planned' CHECK (status IN ('planned', 'live')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (radio_a_id <> radio_b_id)
    );
    CREATE UNIQUE INDEX links_pair_key ON links (least(radio_a_id, radio_b_id), greatest(radio_a_id, radio_b_id));
    CREATE INDEX links_radio_b_idx ON links (radio_b_id);

    CREATE TABLE network_settings (
      id integer PRIMARY KEY DEFAULT 1 CHECK (id = 1),
      name text NOT NULL DEFAULT 'Community network',
      region text NOT NULL DEFAULT 'EU' CHECK (region IN ('US', 'EU', 'JP')),
      time_zone text NOT NULL DEFAULT 'UTC',
      address_pool cidr,
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    INSERT INTO network_settings (id) VALUES (1);

    -- express-session store (connect-pg-simple's layout)
    CREATE TABLE session (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL
    );
    CREATE INDEX session_expire_idx ON session (expire);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TABLE IF EXISTS session, network_settings, links, radios, nodes, sites,
      operator_assignments, neighbourhoods, users CASCADE;
  `);
}
