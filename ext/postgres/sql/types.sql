-- SPDX-License-Identifier: MIT
-- almanac for PostgreSQL: the types of spec and zone arguments.
\echo Use "CREATE EXTENSION almanac" to load this file. \quit

-- A period spec ('week', '15 minutes', 'quarter starting april') and an IANA
-- zone name ('America/Denver'). Both hold their text as written and are
-- read by the function that uses them, so a bad one fails with the message
-- that names the function and the argument. They are not collatable, which
-- lets postgres_fdw ship a call such as period_floor(ts, 'week') to a shard.
CREATE TYPE period_spec;
CREATE FUNCTION period_spec_in(cstring) RETURNS period_spec
    AS 'textin' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION period_spec_out(period_spec) RETURNS cstring
    AS 'textout' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION period_spec_recv(internal) RETURNS period_spec
    AS 'textrecv' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION period_spec_send(period_spec) RETURNS bytea
    AS 'textsend' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE TYPE period_spec (
    INPUT = period_spec_in, OUTPUT = period_spec_out,
    RECEIVE = period_spec_recv, SEND = period_spec_send,
    INTERNALLENGTH = VARIABLE, STORAGE = extended, CATEGORY = 'U');
CREATE CAST (text AS period_spec) WITHOUT FUNCTION AS IMPLICIT;
CREATE CAST (varchar AS period_spec) WITHOUT FUNCTION AS IMPLICIT;
CREATE CAST (period_spec AS text) WITHOUT FUNCTION;

CREATE TYPE zone_name;
CREATE FUNCTION zone_name_in(cstring) RETURNS zone_name
    AS 'textin' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION zone_name_out(zone_name) RETURNS cstring
    AS 'textout' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION zone_name_recv(internal) RETURNS zone_name
    AS 'textrecv' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION zone_name_send(zone_name) RETURNS bytea
    AS 'textsend' LANGUAGE internal IMMUTABLE STRICT PARALLEL SAFE;
CREATE TYPE zone_name (
    INPUT = zone_name_in, OUTPUT = zone_name_out,
    RECEIVE = zone_name_recv, SEND = zone_name_send,
    INTERNALLENGTH = VARIABLE, STORAGE = extended, CATEGORY = 'U');
CREATE CAST (text AS zone_name) WITHOUT FUNCTION AS IMPLICIT;
CREATE CAST (varchar AS zone_name) WITHOUT FUNCTION AS IMPLICIT;
CREATE CAST (zone_name AS text) WITHOUT FUNCTION;

CREATE FUNCTION almanac_version() RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_version' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
-- The tz release in use can change under a running server (a tzdata upgrade).
CREATE FUNCTION almanac_tz_version() RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_tz_version' LANGUAGE C STABLE STRICT PARALLEL SAFE;

CREATE FUNCTION period_of_serial(serial bigint, spec period_spec) RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_period_of_serial' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION period_of_serial(serial bigint, spec period_spec, zone zone_name) RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_period_of_serial' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
