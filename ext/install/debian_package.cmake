# SPDX-License-Identifier: MIT
# The Debian packages, built with `cpack -G DEB` in the build folder:
#   libalmanac0     the loadable module (${libdir}/sqlite3/almanac.so) and the
#                   shared library libalmanac.so.0 (named for its SONAME, as
#                   Debian's library policy asks)
#   libalmanac-dev  almanac.h, almanac_version.h, libalmanac.a, the .so link,
#                   almanac.pc and the CMake package
#   postgresql-15-almanac  the PostgreSQL extension (ext/postgres): the module in
#                   the server's pkglibdir, almanac.control and the script in its
#                   sharedir/extension (built when ALMANAC_POSTGRES is on; the
#                   15 is the server's major version, as Debian names such packages)
# Depends of libalmanac0 come from dpkg-shlibdeps (what the binaries link);
# libalmanac-dev adds the headers and CMake packages its files name.

set(ALMANAC_DEB_RUNTIME libalmanac${ALMANAC_SOVERSION})
set(ALMANAC_DEB_DEVELOPMENT libalmanac-dev)
set(ALMANAC_DEB_COMPONENTS runtime development)
if(ALMANAC_POSTGRES)
  execute_process(COMMAND ${ALMANAC_PG_CONFIG} --version OUTPUT_VARIABLE almanac_pg_version
                  OUTPUT_STRIP_TRAILING_WHITESPACE)
  string(REGEX MATCH "[0-9]+" ALMANAC_PG_MAJOR "${almanac_pg_version}")
  set(ALMANAC_DEB_POSTGRES postgresql-${ALMANAC_PG_MAJOR}-almanac)
  list(APPEND ALMANAC_DEB_COMPONENTS postgres)
endif()

# Each package carries the licence as a machine-readable copyright file
# (Debian calls the MIT licence "Expat") and a changelog, in its doc folder.
file(READ ${CMAKE_SOURCE_DIR}/LICENSE almanac_license)
string(REGEX REPLACE "^MIT License\n\n" "" almanac_license "${almanac_license}")
string(REGEX MATCH "Copyright \\(c\\) ([^\n]*)" almanac_holder "${almanac_license}")
set(almanac_holder "${CMAKE_MATCH_1}")
string(REGEX REPLACE "Copyright \\(c\\) [^\n]*\n\n" "" almanac_license "${almanac_license}")
string(STRIP "${almanac_license}" almanac_license)
string(REPLACE "\n\n" "\n.\n" almanac_license "${almanac_license}")
string(REPLACE "\n" "\n " almanac_license "${almanac_license}")
set(ALMANAC_DEB_DOC ${CMAKE_BINARY_DIR}/debian_doc)
file(WRITE ${ALMANAC_DEB_DOC}/copyright
"Format: https://www.debian.org/doc/packaging-manuals/copyright-format/1.0/
Upstream-Name: almanac
Source: ${ALMANAC_HOMEPAGE}

Files: *
Copyright: ${almanac_holder}
License: Expat
 ${almanac_license}
")
string(TIMESTAMP almanac_changelog_date "%a, %d %b %Y %H:%M:%S +0000" UTC)
file(WRITE ${ALMANAC_DEB_DOC}/changelog
"almanac (${PROJECT_VERSION}) unstable; urgency=medium

  * Release ${PROJECT_VERSION}, built from the almanac sources with CPack.

 -- The almanac authors <almanac@almanac.invalid>  ${almanac_changelog_date}
")
file(ARCHIVE_CREATE OUTPUT ${ALMANAC_DEB_DOC}/changelog.Debian.gz
     PATHS ${ALMANAC_DEB_DOC}/changelog FORMAT raw COMPRESSION GZip COMPRESSION_LEVEL 9 MTIME 0)
foreach(component ${ALMANAC_DEB_COMPONENTS})
  if(component STREQUAL runtime)
    set(package ${ALMANAC_DEB_RUNTIME})
  elseif(component STREQUAL postgres)
    set(package ${ALMANAC_DEB_POSTGRES})
  else()
    set(package ${ALMANAC_DEB_DEVELOPMENT})
  endif()
  install(FILES ${ALMANAC_DEB_DOC}/copyright ${ALMANAC_DEB_DOC}/changelog.Debian.gz
          DESTINATION ${CMAKE_INSTALL_DATADIR}/doc/${package} COMPONENT ${component})
endforeach()

set(CPACK_GENERATOR DEB)
set(CPACK_PACKAGE_NAME almanac)
set(CPACK_PACKAGE_VENDOR "The almanac authors")
set(CPACK_PACKAGE_CONTACT "The almanac authors <almanac@almanac.invalid>")
# No CPACK_PACKAGE_DESCRIPTION_SUMMARY: CPack would put it before each
# package's own synopsis (the first line of its description below).
set(CPACK_PACKAGE_HOMEPAGE_URL ${ALMANAC_HOMEPAGE})
set(CPACK_PACKAGE_DIRECTORY ${CMAKE_BINARY_DIR}/packages)
set(CPACK_STRIP_FILES ON)
set(CPACK_COMPONENTS_ALL ${ALMANAC_DEB_COMPONENTS})
set(CPACK_DEB_COMPONENT_INSTALL ON)
set(CPACK_DEBIAN_FILE_NAME DEB-DEFAULT)
set(CPACK_DEBIAN_PACKAGE_RELEASE 1)
set(CPACK_DEBIAN_PACKAGE_SECTION libs)
set(CPACK_DEBIAN_PACKAGE_PRIORITY optional)
set(CPACK_DEBIAN_PACKAGE_SHLIBDEPS ON)
set(CPACK_DEBIAN_PACKAGE_GENERATE_SHLIBS ON)
set(CPACK_DEBIAN_PACKAGE_GENERATE_SHLIBS_POLICY "=")

set(CPACK_DEBIAN_RUNTIME_PACKAGE_NAME ${ALMANAC_DEB_RUNTIME})
# The linker cache is refreshed by dpkg's ldconfig trigger, as Debian's policy
# asks (8.1.1); CPack would otherwise write maintainer scripts that call
# ldconfig, so they are given here with nothing left for them to do.
set(ALMANAC_DEB_CONTROL ${CMAKE_BINARY_DIR}/debian_control)
file(WRITE ${ALMANAC_DEB_CONTROL}/triggers "activate-noawait ldconfig\n")
foreach(script postinst postrm)
  file(WRITE ${ALMANAC_DEB_CONTROL}/${script} "#!/bin/sh\nset -e\n")
  file(CHMOD ${ALMANAC_DEB_CONTROL}/${script} FILE_PERMISSIONS OWNER_READ OWNER_WRITE
       OWNER_EXECUTE GROUP_READ GROUP_EXECUTE WORLD_READ WORLD_EXECUTE)
endforeach()
set(CPACK_DEBIAN_RUNTIME_PACKAGE_CONTROL_EXTRA
    ${ALMANAC_DEB_CONTROL}/triggers ${ALMANAC_DEB_CONTROL}/postinst ${ALMANAC_DEB_CONTROL}/postrm)
set(CPACK_DEBIAN_RUNTIME_PACKAGE_CONTROL_STRICT_PERMISSION ON)
set(CPACK_DEBIAN_RUNTIME_PACKAGE_SECTION libs)
set(CPACK_DEBIAN_RUNTIME_DESCRIPTION
"calendar periods, window statistics and charts for SQLite
almanac adds SQL functions to SQLite: calendar periods in the shop's own
time zone, exact moving means and trend statistics that work as aggregates
and sliding windows, and SVG charts. This package holds the loadable module
for the sqlite3 shell (.load /usr/lib/<triplet>/sqlite3/almanac) and the
shared library for applications that embed SQLite.")

set(CPACK_DEBIAN_DEVELOPMENT_PACKAGE_NAME ${ALMANAC_DEB_DEVELOPMENT})
set(CPACK_DEBIAN_DEVELOPMENT_PACKAGE_SECTION libdevel)
set(CPACK_DEBIAN_DEVELOPMENT_PACKAGE_SHLIBDEPS OFF)
set(CPACK_DEBIAN_DEVELOPMENT_PACKAGE_DEPENDS
    "${ALMANAC_DEB_RUNTIME} (= ${PROJECT_VERSION}-1), libsqlite3-dev, libhowardhinnant-date-dev")
set(CPACK_DEBIAN_DEVELOPMENT_DESCRIPTION
"development files for almanac, SQLite functions for calendar periods
almanac adds SQL functions to SQLite: calendar periods, exact window
statistics and SVG charts. This package holds the header almanac.h, the
static library, almanac.pc for pkg-config and the CMake package for
find_package(almanac), for applications that link almanac in.")

if(ALMANAC_POSTGRES)
  set(CPACK_DEBIAN_POSTGRES_PACKAGE_NAME ${ALMANAC_DEB_POSTGRES})
  set(CPACK_DEBIAN_POSTGRES_PACKAGE_SECTION database)
  # dpkg-shlibdeps gives the C++ runtime; the server itself is named here,
  # as the module only loads into it.
  set(CPACK_DEBIAN_POSTGRES_PACKAGE_DEPENDS "postgresql-${ALMANAC_PG_MAJOR}")
  set(CPACK_DEBIAN_POSTGRES_DESCRIPTION
"calendar periods, exact window statistics and charts for PostgreSQL
almanac adds SQL functions to PostgreSQL ${ALMANAC_PG_MAJOR}: calendar periods in the shop's
own time zone, exact sums and moving means, robust trend statistics and SVG
charts, as aggregates that run in parallel workers and on postgres_fdw
shards. This package holds the extension: CREATE EXTENSION almanac.")
endif()

include(CPack)
