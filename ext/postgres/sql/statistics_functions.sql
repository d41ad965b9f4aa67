
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
CREATE FUNCTION almanac_ewma_timestamptz_step(internal, double precision, timestamptz, period_spec)
    RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_timestamptz_inverse(internal, double precision, timestamptz, period_spec)
    RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE ewma(x double precision, t timestamptz, half_life period_spec) (
    SFUNC = almanac_ewma_timestamptz_step, STYPE = internal, FINALFUNC = almanac_ewma_final,
    COMBINEFUNC = almanac_ewma_combine,
    SERIALFUNC = almanac_ewma_serialize, DESERIALFUNC = almanac_ewma_deserialize,
    MSFUNC = almanac_ewma_timestamptz_step, MINVFUNC = almanac_ewma_timestamptz_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_ewma_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_ewma_timestamp_step(internal, double precision, timestamp, period_spec) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_timestamp_inverse(internal, double precision, timestamp, period_spec) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE ewma(x double precision, t timestamp, half_life period_spec) (
    SFUNC = almanac_ewma_timestamp_step, STYPE = internal, FINALFUNC = almanac_ewma_final,
    COMBINEFUNC = almanac_ewma_combine,
    SERIALFUNC = almanac_ewma_serialize, DESERIALFUNC = almanac_ewma_deserialize,
    MSFUNC = almanac_ewma_timestamp_step, MINVFUNC = almanac_ewma_timestamp_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_ewma_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_ewma_date_step(internal, double precision, date, period_spec) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_date_inverse(internal, double precision, date, period_spec) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE ewma(x double precision, t date, half_life period_spec) (
    SFUNC = almanac_ewma_date_step, STYPE = internal, FINALFUNC = almanac_ewma_final,
    COMBINEFUNC = almanac_ewma_combine,
    SERIALFUNC = almanac_ewma_serialize, DESERIALFUNC = almanac_ewma_deserialize,
    MSFUNC = almanac_ewma_date_step, MINVFUNC = almanac_ewma_date_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_ewma_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_ewma_text_step(internal, double precision, text, period_spec) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_text_inverse(internal, double precision, text, period_spec) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE ewma(x double precision, t text, half_life period_spec) (
    SFUNC = almanac_ewma_text_step, STYPE = internal, FINALFUNC = almanac_ewma_final,
    COMBINEFUNC = almanac_ewma_combine,
    SERIALFUNC = almanac_ewma_serialize, DESERIALFUNC = almanac_ewma_deserialize,
    MSFUNC = almanac_ewma_text_step, MINVFUNC = almanac_ewma_text_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_ewma_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_ewma_number_step(internal, double precision, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_ewma_number_inverse(internal, double precision, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE ewma(x double precision, t double precision, half_life double precision) (
    SFUNC = almanac_ewma_number_step, STYPE = internal, FINALFUNC = almanac_ewma_final,
    COMBINEFUNC = almanac_ewma_combine,
    SERIALFUNC = almanac_ewma_serialize, DESERIALFUNC = almanac_ewma_deserialize,
    MSFUNC = almanac_ewma_number_step, MINVFUNC = almanac_ewma_number_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_ewma_final, PARALLEL = SAFE);
