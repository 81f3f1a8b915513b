// Evidence for lib/skein/sweep/sweep_folder: the sweep folder check and the journal's resume protocol, called
// directly (the parser itself is in journal_test.cpp, the whole command under damage in sweep_journal.sh).
// Rows are real rows of the example sweep's first layouts.
#include <doctest/doctest.h>

#include <stdlib.h>

#include <filesystem>
#include <fstream>
#include <functional>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "skein/input/sweep_file.hpp"
#include "skein/error.hpp"
#include "skein/io/folder_write.hpp"
#include "skein/sweep/journal.hpp"
#include "skein/sweep/sweep_folder.hpp"
#include "skein/sweep/sweep_run.hpp"

namespace fs = std::filesystem;
using namespace skein;

namespace {

const std::string sweep_file = std::string(SKEIN_SOURCE_DIR) + "/designs/sweeps/kestrel-small.yaml";

struct Scratch {
  fs::path dir;
  Scratch() {
    std::string tmpl = (fs::temp_directory_path() / "skein-sweep-folder-XXXXXX").string();
    REQUIRE(::mkdtemp(tmpl.data()) != nullptr);
    dir = tmpl;
  }
  ~Scratch() {
    std::error_code ec;
    fs::remove_all(dir, ec);
  }
};

std::string get(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

void put(const fs::path& p, const std::string& text) { std::ofstream(p, std::ios::binary | std::ios::trunc) << text; }

std::string error_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

// The example sweep, its layouts, and the rows of its first three layouts.
struct Example {
  Sweep sweep;
  LayoutSet set;
  std::map<size_t, std::string> rows;
  std::string header;
};

const Example& example() {
  static const Example e = [] {
    Example x;
    x.sweep = read_sweep_file(sweep_file);
    x.set = expand_layouts(x.sweep);
    evaluate_layouts(x.sweep, x.set, {0, 1, 2}, [&](size_t i, const std::string& row) { x.rows[i] = row; });
    x.header = journal_header(x.sweep.fingerprint, x.set.layouts.size());
    return x;
  }();
  return e;
}

SweepFolderOptions folder_options() {
  SweepFolderOptions o;
  o.sweep_file = sweep_file;
  return o;
}

}  // namespace

TEST_CASE("sweep folder: a new folder gets its marker and a journal header, and no rows") {
  const Example& x = example();
  Scratch s;
  const fs::path dir = s.dir / "new";
  const JournalResume r = open_sweep_journal(folder_options(), dir.string(), x.sweep, x.set);
  CHECK(r.rows.empty());
  CHECK(r.damaged_lines == 0);
  CHECK(is_skein_output_folder(dir.string()));
  CHECK(get(journal_path(dir.string())) == x.header);
}

TEST_CASE("sweep folder: an earlier journal with rows needs --resume or --restart") {
  const Example& x = example();
  Scratch s;
  const std::string dir = (s.dir / "out").string();
  open_sweep_journal(folder_options(), dir, x.sweep, x.set);
  const std::string journal = x.header + journal_line(0, x.rows.at(0)) + journal_line(1, x.rows.at(1));
  put(journal_path(dir), journal);

  const std::string m = error_of([&] { open_sweep_journal(folder_options(), dir, x.sweep, x.set); });
  CHECK(m == journal_path(dir) + ": a journal of an earlier run is there; pass --resume to continue it or --restart to "
                                 "discard it");
  CHECK(get(journal_path(dir)) == journal);  // refused: untouched

  SweepFolderOptions resume = folder_options();
  resume.resume = true;
  const JournalResume r = open_sweep_journal(resume, dir, x.sweep, x.set);
  CHECK(r.rows == std::map<size_t, std::string>{{0, x.rows.at(0)}, {1, x.rows.at(1)}});
  CHECK(r.damaged_lines == 0);
  CHECK(get(journal_path(dir)) == journal);  // already compact: the same bytes

  SweepFolderOptions restart = folder_options();
  restart.restart = true;
  CHECK(open_sweep_journal(restart, dir, x.sweep, x.set).rows.empty());
  CHECK(get(journal_path(dir)) == x.header);
}

TEST_CASE("sweep folder: resuming drops a row journaled under another layout's index and rewrites the journal") {
  const Example& x = example();
  Scratch s;
  const std::string dir = (s.dir / "out").string();
  open_sweep_journal(folder_options(), dir, x.sweep, x.set);
  // Layout 2's row under index 5: its checksum is valid (journal_line computes it), but it is not layout 5's.
  put(journal_path(dir),
      x.header + journal_line(0, x.rows.at(0)) + journal_line(5, x.rows.at(2)) + journal_line(1, x.rows.at(1)));
  SweepFolderOptions resume = folder_options();
  resume.resume = true;
  const JournalResume r = open_sweep_journal(resume, dir, x.sweep, x.set);
  CHECK(r.rows == std::map<size_t, std::string>{{0, x.rows.at(0)}, {1, x.rows.at(1)}});
  CHECK(r.damaged_lines == 1);
  CHECK(get(journal_path(dir)) == x.header + journal_line(0, x.rows.at(0)) + journal_line(1, x.rows.at(1)));
}

TEST_CASE("sweep folder: a damaged journal header is refused by --resume and salvaged by --salvage") {
  const Example& x = example();
  Scratch s;
  const std::string dir = (s.dir / "out").string();
  open_sweep_journal(folder_options(), dir, x.sweep, x.set);
  const std::string damaged = "skein-sweep-jou\x01nal garbage\n" + journal_line(0, x.rows.at(0)) +
                              journal_line(2, x.rows.at(2));
  put(journal_path(dir), damaged);
  SweepFolderOptions resume = folder_options();
  resume.resume = true;
  const std::string m = error_of([&] { open_sweep_journal(resume, dir, x.sweep, x.set); });
  CHECK(m.find("--salvage") != std::string::npos);
  CHECK(get(journal_path(dir)) == damaged);  // refused: untouched

  SweepFolderOptions salvage = folder_options();
  salvage.salvage = true;
  const JournalResume r = open_sweep_journal(salvage, dir, x.sweep, x.set);
  CHECK(r.rows == std::map<size_t, std::string>{{0, x.rows.at(0)}, {2, x.rows.at(2)}});
  CHECK(get(journal_path(dir)) == x.header + journal_line(0, x.rows.at(0)) + journal_line(2, x.rows.at(2)));
}

TEST_CASE("sweep folder: a folder skein did not write, a file, or the sweep's own folder is refused") {
  const Example& x = example();
  Scratch s;
  SUBCASE("a foreign non-empty folder, unless --overwrite") {
    const fs::path dir = s.dir / "foreign";
    fs::create_directories(dir);
    put(dir / "notes.txt", "kept\n");
    const std::string m = error_of([&] { check_sweep_folder(folder_options(), dir.string(), x.sweep); });
    CHECK(m.rfind("--out " + dir.string() + ": the folder exists and was not written by skein", 0) == 0);
    CHECK(!fs::exists(dir / ".skein-output"));
    SweepFolderOptions o = folder_options();
    o.overwrite = true;
    CHECK(error_of([&] { check_sweep_folder(o, dir.string(), x.sweep); }).empty());
  }
  SUBCASE("a folder holding only a journal a sweep wrote before folders had markers") {
    const fs::path dir = s.dir / "old";
    fs::create_directories(dir);
    put(dir / "journal.txt", x.header);
    CHECK(error_of([&] { check_sweep_folder(folder_options(), dir.string(), x.sweep); }).empty());
  }
  SUBCASE("a file") {
    const fs::path file = s.dir / "file";
    put(file, "x");
    CHECK(error_of([&] { check_sweep_folder(folder_options(), file.string(), x.sweep); }) ==
          "--out " + file.string() + ": exists and is not a folder; expected a folder path");
  }
  SUBCASE("the folder holding the sweep file") {
    const std::string m =
        error_of([&] { check_sweep_folder(folder_options(), fs::path(sweep_file).parent_path().string(), x.sweep); });
    CHECK(m.rfind("--out", 0) == 0);
  }
}
