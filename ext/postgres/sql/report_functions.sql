
-- Report functions (ext/postgres/report_functions.cpp): plain aggregates whose
-- states are their rows, combined by feeding one state's rows into the other.
CREATE FUNCTION almanac_sparkline_final(internal) RETURNS text
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_sparkline_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_sparkline_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_sparkline_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_final(internal) RETURNS text
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_final(internal) RETURNS text
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_combine(internal, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_serialize(internal) RETURNS bytea
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_deserialize(bytea, internal) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION almanac_sparkline_number_step(internal, double precision, double precision) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_number_step(internal, double precision, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_number_step(internal, double precision, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_number_step(internal, double precision, double precision, text, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_number_step(internal, double precision, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_number_step(internal, double precision, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE sparkline(y double precision, x double precision) (
    SFUNC = almanac_sparkline_number_step, STYPE = internal, FINALFUNC = almanac_sparkline_final,
    COMBINEFUNC = almanac_sparkline_combine,
    SERIALFUNC = almanac_sparkline_serialize, DESERIALFUNC = almanac_sparkline_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x double precision, y double precision, series text) (
    SFUNC = almanac_svg_line_chart_number_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x double precision, y double precision, series text, layer text) (
    SFUNC = almanac_svg_line_chart_number_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x double precision, y double precision, series text, layer text, options text) (
    SFUNC = almanac_svg_line_chart_number_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x double precision, y double precision, series text) (
    SFUNC = almanac_svg_bar_chart_number_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x double precision, y double precision, series text, options text) (
    SFUNC = almanac_svg_bar_chart_number_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE FUNCTION almanac_sparkline_timestamptz_step(internal, double precision, timestamptz) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_timestamptz_step(internal, timestamptz, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_timestamptz_step(internal, timestamptz, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_timestamptz_step(internal, timestamptz, double precision, text, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_timestamptz_step(internal, timestamptz, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_timestamptz_step(internal, timestamptz, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE sparkline(y double precision, x timestamptz) (
    SFUNC = almanac_sparkline_timestamptz_step, STYPE = internal, FINALFUNC = almanac_sparkline_final,
    COMBINEFUNC = almanac_sparkline_combine,
    SERIALFUNC = almanac_sparkline_serialize, DESERIALFUNC = almanac_sparkline_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x timestamptz, y double precision, series text) (
    SFUNC = almanac_svg_line_chart_timestamptz_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x timestamptz, y double precision, series text, layer text) (
    SFUNC = almanac_svg_line_chart_timestamptz_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x timestamptz, y double precision, series text, layer text, options text) (
    SFUNC = almanac_svg_line_chart_timestamptz_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x timestamptz, y double precision, series text) (
    SFUNC = almanac_svg_bar_chart_timestamptz_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x timestamptz, y double precision, series text, options text) (
    SFUNC = almanac_svg_bar_chart_timestamptz_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE FUNCTION almanac_sparkline_timestamp_step(internal, double precision, timestamp) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_timestamp_step(internal, timestamp, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_timestamp_step(internal, timestamp, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_timestamp_step(internal, timestamp, double precision, text, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_timestamp_step(internal, timestamp, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_timestamp_step(internal, timestamp, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE sparkline(y double precision, x timestamp) (
    SFUNC = almanac_sparkline_timestamp_step, STYPE = internal, FINALFUNC = almanac_sparkline_final,
    COMBINEFUNC = almanac_sparkline_combine,
    SERIALFUNC = almanac_sparkline_serialize, DESERIALFUNC = almanac_sparkline_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x timestamp, y double precision, series text) (
    SFUNC = almanac_svg_line_chart_timestamp_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x timestamp, y double precision, series text, layer text) (
    SFUNC = almanac_svg_line_chart_timestamp_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x timestamp, y double precision, series text, layer text, options text) (
    SFUNC = almanac_svg_line_chart_timestamp_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x timestamp, y double precision, series text) (
    SFUNC = almanac_svg_bar_chart_timestamp_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x timestamp, y double precision, series text, options text) (
    SFUNC = almanac_svg_bar_chart_timestamp_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE FUNCTION almanac_sparkline_date_step(internal, double precision, date) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_date_step(internal, date, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_date_step(internal, date, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_date_step(internal, date, double precision, text, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_date_step(internal, date, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_date_step(internal, date, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE sparkline(y double precision, x date) (
    SFUNC = almanac_sparkline_date_step, STYPE = internal, FINALFUNC = almanac_sparkline_final,
    COMBINEFUNC = almanac_sparkline_combine,
    SERIALFUNC = almanac_sparkline_serialize, DESERIALFUNC = almanac_sparkline_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x date, y double precision, series text) (
    SFUNC = almanac_svg_line_chart_date_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x date, y double precision, series text, layer text) (
    SFUNC = almanac_svg_line_chart_date_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x date, y double precision, series text, layer text, options text) (
    SFUNC = almanac_svg_line_chart_date_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x date, y double precision, series text) (
    SFUNC = almanac_svg_bar_chart_date_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x date, y double precision, series text, options text) (
    SFUNC = almanac_svg_bar_chart_date_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE FUNCTION almanac_sparkline_text_step(internal, double precision, text) RETURNS internal
    AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_text_step(internal, text, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_text_step(internal, text, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_line_chart_text_step(internal, text, double precision, text, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_text_step(internal, text, double precision, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION almanac_svg_bar_chart_text_step(internal, text, double precision, text, text)
    RETURNS internal AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE AGGREGATE sparkline(y double precision, x text) (
    SFUNC = almanac_sparkline_text_step, STYPE = internal, FINALFUNC = almanac_sparkline_final,
    COMBINEFUNC = almanac_sparkline_combine,
    SERIALFUNC = almanac_sparkline_serialize, DESERIALFUNC = almanac_sparkline_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x text, y double precision, series text) (
    SFUNC = almanac_svg_line_chart_text_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x text, y double precision, series text, layer text) (
    SFUNC = almanac_svg_line_chart_text_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_line_chart(x text, y double precision, series text, layer text, options text) (
    SFUNC = almanac_svg_line_chart_text_step, STYPE = internal, FINALFUNC = almanac_svg_line_chart_final,
    COMBINEFUNC = almanac_svg_line_chart_combine,
    SERIALFUNC = almanac_svg_line_chart_serialize, DESERIALFUNC = almanac_svg_line_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x text, y double precision, series text) (
    SFUNC = almanac_svg_bar_chart_text_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
CREATE AGGREGATE svg_bar_chart(x text, y double precision, series text, options text) (
    SFUNC = almanac_svg_bar_chart_text_step, STYPE = internal, FINALFUNC = almanac_svg_bar_chart_final,
    COMBINEFUNC = almanac_svg_bar_chart_combine,
    SERIALFUNC = almanac_svg_bar_chart_serialize, DESERIALFUNC = almanac_svg_bar_chart_deserialize,
    PARALLEL = SAFE);
