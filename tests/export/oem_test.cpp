// Evidence for lib/skein/export/oem.hpp: CCSDS 502.0-B-2 OEM KVN written and parsed back.
#include <doctest/doctest.h>

#include "skein/constants.hpp"
#include "skein/error.hpp"
#include "skein/export/oem.hpp"

using namespace skein;

TEST_CASE("oem: a sampled segment parses back to the same states and header") {
  MeanElements el;
  el.a_km = 7000.0;
  el.e = 0.001;
  el.i_rad = 1.7;
  const SecularOrbit orbit = make_secular_orbit(wgs84, el);
  const UtcEpoch epoch = *parse_utc_iso8601("2027-03-01T00:00:00Z");
  OemMessage m;
  m.creation_date = "2027-02-01T00:00:00.000";
  m.originator = "MARROW BAY ORBITAL";
  m.segments.push_back(sample_oem_segment(wgs84, orbit, epoch, 3600.0, 60.0, "kestrel-p01-s01", "KESTREL-001"));
  const std::string text = render_oem(m);
  // CCSDS 502.0-B-2 sec. 5.2: the first line is the version keyword; the header and the metadata keywords.
  CHECK(text.starts_with("CCSDS_OEM_VERS = 2.0\n"));
  for (const char* key : {"CREATION_DATE = ", "ORIGINATOR = ", "META_START", "OBJECT_NAME = kestrel-p01-s01",
                          "OBJECT_ID = KESTREL-001", "CENTER_NAME = EARTH", "REF_FRAME = TOD", "TIME_SYSTEM = UTC",
                          "START_TIME = 2027-03-01T00:00:00.000", "STOP_TIME = 2027-03-01T01:00:00.000", "META_STOP"})
    CHECK(text.find(key) != std::string::npos);
  const OemMessage back = parse_oem(text, "t.oem");
  REQUIRE(back.segments.size() == 1);
  const auto& a = m.segments[0].samples;
  const auto& b = back.segments[0].samples;
  REQUIRE(a.size() == 61);
  REQUIRE(b.size() == a.size());
  for (size_t k = 0; k < a.size(); ++k) {
    // Written with 6 decimals of km and 9 of km/s: the round trip is exact to those digits.
    CHECK((a[k].state.r_km - b[k].state.r_km).cwiseAbs().maxCoeff() <= 5e-7);
    CHECK((a[k].state.v_km_s - b[k].state.v_km_s).cwiseAbs().maxCoeff() <= 5e-10);
    CHECK(format_utc_iso8601(a[k].epoch) == format_utc_iso8601(b[k].epoch));
  }
  CHECK(back.originator == "MARROW BAY ORBITAL");
  CHECK(back.segments[0].ref_frame == "TOD");
}

TEST_CASE("oem: garbage is refused with the line number") {
  CHECK_THROWS_AS(parse_oem("hello\n", "x.oem"), InputError);
  try {
    parse_oem("CCSDS_OEM_VERS = 2.0\nMETA_START\nOBJECT_NAME = a\nMETA_STOP\n2027-01-01T00:00:00 1 2 3\n", "x.oem");
    FAIL("expected an error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) == "x.oem:5: expected an epoch and six numbers");
  }
}
