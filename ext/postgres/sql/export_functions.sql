-- SPDX-License-Identifier: MIT

-- Exact sums (ext/postgres/export_functions.cpp): combined exactly, so every plan
-- gives the same bits; a real inverse for sliding frames.
CREATE FUNCTION almanac_exact_sum_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;

CREATE FUNCTION almanac_exact_sum_real_step(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_real_inverse(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_real_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE exact_sum(double precision) (
    SFUNC = almanac_exact_sum_real_step, STYPE = internal,
    FINALFUNC = almanac_exact_sum_real_final,
    COMBINEFUNC = almanac_exact_sum_combine,
    SERIALFUNC = almanac_exact_sum_serialize, DESERIALFUNC = almanac_exact_sum_deserialize,
    MSFUNC = almanac_exact_sum_real_step, MINVFUNC = almanac_exact_sum_real_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_exact_sum_real_final,
    PARALLEL = SAFE);

CREATE FUNCTION almanac_exact_sum_integer_final(internal) RETURNS bigint
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_int64_step(internal, bigint) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_int64_inverse(internal, bigint) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE exact_sum(bigint) (
    SFUNC = almanac_exact_sum_int64_step, STYPE = internal,
    FINALFUNC = almanac_exact_sum_integer_final,
    COMBINEFUNC = almanac_exact_sum_combine,
    SERIALFUNC = almanac_exact_sum_serialize, DESERIALFUNC = almanac_exact_sum_deserialize,
    MSFUNC = almanac_exact_sum_int64_step, MINVFUNC = almanac_exact_sum_int64_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_exact_sum_integer_final,
    PARALLEL = SAFE);
CREATE FUNCTION almanac_exact_sum_int32_step(internal, integer) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_int32_inverse(internal, integer) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE exact_sum(integer) (
    SFUNC = almanac_exact_sum_int32_step, STYPE = internal,
    FINALFUNC = almanac_exact_sum_integer_final,
    COMBINEFUNC = almanac_exact_sum_combine,
    SERIALFUNC = almanac_exact_sum_serialize, DESERIALFUNC = almanac_exact_sum_deserialize,
    MSFUNC = almanac_exact_sum_int32_step, MINVFUNC = almanac_exact_sum_int32_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_exact_sum_integer_final,
    PARALLEL = SAFE);
CREATE FUNCTION almanac_exact_sum_int16_step(internal, smallint) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_exact_sum_int16_inverse(internal, smallint) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE exact_sum(smallint) (
    SFUNC = almanac_exact_sum_int16_step, STYPE = internal,
    FINALFUNC = almanac_exact_sum_integer_final,
    COMBINEFUNC = almanac_exact_sum_combine,
    SERIALFUNC = almanac_exact_sum_serialize, DESERIALFUNC = almanac_exact_sum_deserialize,
    MSFUNC = almanac_exact_sum_int16_step, MINVFUNC = almanac_exact_sum_int16_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_exact_sum_integer_final,
    PARALLEL = SAFE);

CREATE FUNCTION to_amount(text text) RETURNS double precision
    AS 'MODULE_PATHNAME', 'almanac_to_amount' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION to_amount(text text, decimal_mark text) RETURNS double precision
    AS 'MODULE_PATHNAME', 'almanac_to_amount' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;

CREATE FUNCTION to_time(text text, format text) RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_to_time' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION to_time(text text, format text, zone zone_name) RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_to_time' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION to_time(serial double precision, format text) RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_to_time_serial' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION to_time(serial double precision, format text, zone zone_name) RETURNS text
    AS 'MODULE_PATHNAME', 'almanac_to_time_serial' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
