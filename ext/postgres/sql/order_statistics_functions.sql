-- SPDX-License-Identifier: MIT

-- Order statistics and robust trends (ext/postgres/order_statistics_functions.cpp):
-- states combine by merging their values.
CREATE FUNCTION almanac_values_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_values_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_values_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_points_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_points_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_points_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;

CREATE FUNCTION almanac_median_step(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_median_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_median_sliding_step(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_median_sliding_inverse(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_median_sliding_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE median(x double precision) (
    SFUNC = almanac_median_step, STYPE = internal, FINALFUNC = almanac_median_final,
    COMBINEFUNC = almanac_values_combine,
    SERIALFUNC = almanac_values_serialize, DESERIALFUNC = almanac_values_deserialize,
    MSFUNC = almanac_median_sliding_step, MINVFUNC = almanac_median_sliding_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_median_sliding_final, PARALLEL = SAFE);

CREATE FUNCTION almanac_mad_step(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_mad_inverse(internal, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_mad_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE mad(x double precision) (
    SFUNC = almanac_mad_step, STYPE = internal, FINALFUNC = almanac_mad_final,
    COMBINEFUNC = almanac_values_combine,
    SERIALFUNC = almanac_values_serialize, DESERIALFUNC = almanac_values_deserialize,
    MSFUNC = almanac_mad_step, MINVFUNC = almanac_mad_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_mad_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_theil_sen_step(internal, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_theil_sen_inverse(internal, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_theil_sen_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE theil_sen_slope(y double precision, x double precision) (
    SFUNC = almanac_theil_sen_step, STYPE = internal, FINALFUNC = almanac_theil_sen_final,
    COMBINEFUNC = almanac_points_combine,
    SERIALFUNC = almanac_points_serialize, DESERIALFUNC = almanac_points_deserialize,
    MSFUNC = almanac_theil_sen_step, MINVFUNC = almanac_theil_sen_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_theil_sen_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_theil_sen_step(internal, double precision, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_theil_sen_inverse(internal, double precision, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_seasonal_theil_sen_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE theil_sen_slope(y double precision, x double precision, season double precision) (
    SFUNC = almanac_theil_sen_step, STYPE = internal, FINALFUNC = almanac_seasonal_theil_sen_final,
    COMBINEFUNC = almanac_points_combine,
    SERIALFUNC = almanac_points_serialize, DESERIALFUNC = almanac_points_deserialize,
    MSFUNC = almanac_theil_sen_step, MINVFUNC = almanac_theil_sen_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_seasonal_theil_sen_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_mann_kendall_step(internal, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_mann_kendall_inverse(internal, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_mann_kendall_final(internal) RETURNS double precision
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE mann_kendall_p(y double precision, x double precision) (
    SFUNC = almanac_mann_kendall_step, STYPE = internal, FINALFUNC = almanac_mann_kendall_final,
    COMBINEFUNC = almanac_points_combine,
    SERIALFUNC = almanac_points_serialize, DESERIALFUNC = almanac_points_deserialize,
    MSFUNC = almanac_mann_kendall_step, MINVFUNC = almanac_mann_kendall_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_mann_kendall_final, PARALLEL = SAFE);
CREATE FUNCTION almanac_mann_kendall_step(internal, double precision, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_mann_kendall_inverse(internal, double precision, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE mann_kendall_p(y double precision, x double precision, season double precision) (
    SFUNC = almanac_mann_kendall_step, STYPE = internal, FINALFUNC = almanac_mann_kendall_final,
    COMBINEFUNC = almanac_points_combine,
    SERIALFUNC = almanac_points_serialize, DESERIALFUNC = almanac_points_deserialize,
    MSFUNC = almanac_mann_kendall_step, MINVFUNC = almanac_mann_kendall_inverse,
    MSTYPE = internal, MFINALFUNC = almanac_mann_kendall_final, PARALLEL = SAFE);
