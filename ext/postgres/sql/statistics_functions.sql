-- SPDX-License-Identifier: MIT

-- Trend and noise statistics (ext/postgres/statistics_functions.cpp): exact
-- sums combine exactly, and each has a real inverse for sliding frames.
CREATE FUNCTION almanac_moving_mean_step(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_moving_mean_inverse(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_moving_mean_step(internal, double precision, bigint) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_moving_mean_inverse(internal, double precision, bigint) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_moving_mean_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_moving_mean_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_moving_mean_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_moving_mean_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE AGGREGATE moving_mean(x double precision) (
    SFUNC = almanac_moving_mean_step, STYPE = internal, FINALFUNC = almanac_moving_mean_final,
    COMBINEFUNC = almanac_moving_mean_combine,
    SERIALFUNC = almanac_moving_mean_serialize, DESERIALFUNC = almanac_moving_mean_deserialize,
    MSFUNC = almanac_moving_mean_step, MINVFUNC = almanac_moving_mean_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_moving_mean_final, PARALLEL = SAFE);
CREATE AGGREGATE moving_mean(x double precision, min_values bigint) (
    SFUNC = almanac_moving_mean_step, STYPE = internal, FINALFUNC = almanac_moving_mean_final,
    COMBINEFUNC = almanac_moving_mean_combine,
    SERIALFUNC = almanac_moving_mean_serialize, DESERIALFUNC = almanac_moving_mean_deserialize,
    MSFUNC = almanac_moving_mean_step, MINVFUNC = almanac_moving_mean_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_moving_mean_final, PARALLEL = SAFE);

CREATE FUNCTION almanac_moments_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_moments_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_moments_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_resid_sd_step(internal, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_resid_sd_inverse(internal, double precision, double precision)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_resid_sd_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE resid_sd(y double precision, x double precision) (
    SFUNC = almanac_resid_sd_step, STYPE = internal, FINALFUNC = almanac_resid_sd_final,
    COMBINEFUNC = almanac_moments_combine,
    SERIALFUNC = almanac_moments_serialize, DESERIALFUNC = almanac_moments_deserialize,
    MSFUNC = almanac_resid_sd_step, MINVFUNC = almanac_resid_sd_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_resid_sd_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_slope_stderr_step(internal, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_slope_stderr_inverse(internal, double precision, double precision)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_slope_stderr_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE slope_stderr(y double precision, x double precision) (
    SFUNC = almanac_slope_stderr_step, STYPE = internal, FINALFUNC = almanac_slope_stderr_final,
    COMBINEFUNC = almanac_moments_combine,
    SERIALFUNC = almanac_moments_serialize, DESERIALFUNC = almanac_moments_deserialize,
    MSFUNC = almanac_slope_stderr_step, MINVFUNC = almanac_slope_stderr_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_slope_stderr_final, PARALLEL = SAFE);

CREATE FUNCTION almanac_ewma_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
