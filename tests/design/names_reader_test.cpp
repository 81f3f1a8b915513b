// Names are data in every file the YAML reader loads, the sweep file included: control characters written
// as YAML escapes are refused at the value's line and column; well-formed text passes.
#include <doctest/doctest.h>

#include <string>

#include "skein/input/yaml_reader.hpp"
#include "skein/error.hpp"
#include "skein/input/sweep_file.hpp"

using namespace skein;

namespace {
std::string message_of(const std::string& text) {
  try {
    yaml::load_text(text, "t.yaml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}
}  // namespace

TEST_CASE("reader: control characters and malformed UTF-8 in values and keys are refused with their position") {
  CHECK(message_of("name: \"a\\tb\"\n").find("t.yaml:1:7: the text \"a\\x09b\" holds the control character U+0009") == 0);
  CHECK(message_of("x: 1\nname: \"a\\x7F\"\n").find("t.yaml:2:7:") == 0);
  CHECK(message_of("\"k\\e\": 1\n").find("t.yaml:1:1: the text \"k\\x1B\" holds the control character U+001B") == 0);
  CHECK(message_of("name: >-\n  folded\n  text\n") == "");  // folded into one line, no final break: legal
  CHECK(message_of("name: >\n  folded\n  text\n").find("U+000A") != std::string::npos);  // keeps a final break
  CHECK(message_of("name: \"caf\xc3\xa9 \xe2\x82\xac \xf0\x9f\x9b\xb0\"\n") == "");  // é € and a 4-byte emoji
  CHECK(message_of("name: \xf0\x80\x80\xaf\n").find("t.yaml:1:7: the file is not UTF-8 text (byte 0xF0") == 0);
  // A sweep file goes through the same reader.
  try {
    read_sweep_text("name: \"trade\\e[2J\"\nbase: demo.yaml\n", "s.yaml", std::string(SKEIN_SOURCE_DIR) + "/designs");
    FAIL("expected an InputError");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()).find("s.yaml:1:7: the text") == 0);
  }
}
