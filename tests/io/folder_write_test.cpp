// Evidence for lib/skein/io/folder_write and output_file: an output path replaces only what skein wrote
// (the .skein-output marker), an empty folder, or anything with overwrite; never an input file or a folder
// holding one; stale staging folders are removed only when both their name and the marker say they are
// skein's. (The kill-at-every-step and signal cases run the executable: tests/io/output_safety.sh.)
#include <doctest/doctest.h>

#include <stdlib.h>
#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>
#include <functional>
#include <fstream>
#include <sstream>
#include <string>

#include "skein/error.hpp"
#include "skein/io/folder_write.hpp"
#include "skein/io/output_file.hpp"
#include "skein/version.hpp"

namespace fs = std::filesystem;
using namespace skein;

namespace {

fs::path temp_dir() {
  std::string tmpl = (fs::temp_directory_path() / "skein-folder-XXXXXX").string();
  REQUIRE(::mkdtemp(tmpl.data()) != nullptr);
  return tmpl;
}

void put(const fs::path& p, const std::string& text) {
  fs::create_directories(p.parent_path());
  std::ofstream(p, std::ios::binary) << text;
}

std::string get(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

std::string error_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("folder_write: a foreign folder is refused and untouched, and empty, own and --overwrite are replaced") {
  const fs::path d = temp_dir();
  put(d / "mine" / "keep.txt", "keep");
  const std::string e = error_of([&] { write_folder_atomic((d / "mine").string(), {{"a.txt", "new"}}); });
  CHECK(e.find("was not written by skein") != std::string::npos);
  CHECK(e.find("--overwrite") != std::string::npos);
  CHECK(get(d / "mine" / "keep.txt") == "keep");
  CHECK(fs::directory_iterator(d) != fs::directory_iterator());
  CHECK(std::distance(fs::directory_iterator(d), fs::directory_iterator()) == 1);  // no staging folder left

  fs::create_directory(d / "empty");
  write_folder_atomic((d / "empty").string(), {{"a.txt", "one"}});
  CHECK(get(d / "empty" / "a.txt") == "one");
  CHECK(is_skein_output_folder((d / "empty").string()));
  write_folder_atomic((d / "empty").string(), {{"b/c.txt", "two"}});  // a previous output: replaced whole
  CHECK(!fs::exists(d / "empty" / "a.txt"));
  CHECK(get(d / "empty" / "b" / "c.txt") == "two");

  FolderWriteOptions o;
  o.overwrite = true;
  write_folder_atomic((d / "mine").string(), {{"a.txt", "new"}}, o);
  CHECK(!fs::exists(d / "mine" / "keep.txt"));
  CHECK(get(d / "mine" / "a.txt") == "new");

  put(d / "file", "a file");
  CHECK(error_of([&] { write_folder_atomic((d / "file").string(), {}, o); }).find("is not a folder") != std::string::npos);
  CHECK(get(d / "file") == "a file");
  fs::remove_all(d);
}

TEST_CASE("folder_write: a marker must say skein, and a file named like it with other text does not count") {
  const fs::path d = temp_dir();
  put(d / "x" / ".skein-output", "something else\n");
  CHECK(!is_skein_output_folder((d / "x").string()));
  put(d / "y" / ".skein-output", output_marker_text());
  CHECK(is_skein_output_folder((d / "y").string()));
  CHECK(output_marker_text().rfind(std::string("skein output folder, version ") + SKEIN_VERSION, 0) == 0);
  fs::remove_all(d);
}

TEST_CASE("folder_write: no output may equal or contain an input, compared as canonical paths") {
  const fs::path d = temp_dir();
  put(d / "proj" / "design.yaml", "name: x\n");
  FolderWriteOptions o;
  o.overwrite = true;
  o.inputs = {(d / "proj" / "design.yaml").string()};
  // The same folder written three ways: plainly, with a trailing slash, and through "..".
  for (const std::string& out : {(d / "proj").string(), (d / "proj").string() + "/",
                                (d / "proj" / ".." / "proj").string(), d.string()}) {
    const std::string e = error_of([&] { write_folder_atomic(out, {{"a.txt", "x"}}, o); });
    CHECK_MESSAGE(e.find("contains the input file") != std::string::npos, out);
  }
  CHECK(get(d / "proj" / "design.yaml") == "name: x\n");
  // A symbolic link to the folder is the same folder.
  fs::create_directory_symlink(d / "proj", d / "link");
  CHECK(error_of([&] { check_output_not_input((d / "link").string(), o.inputs, "--out"); }).find("contains") !=
        std::string::npos);
  // A sibling whose name starts the same is not the folder ("proj2" does not contain "proj/design.yaml").
  CHECK(error_of([&] { write_folder_atomic((d / "proj2").string(), {{"a.txt", "x"}}, o); }).empty());

  // A hard link to the design is the design under another name.
  fs::create_hard_link(d / "proj" / "design.yaml", d / "alias.csv");
  CHECK(error_of([&] { check_output_not_input((d / "alias.csv").string(), o.inputs, "--points"); })
            .find("the same file under another name") != std::string::npos);

  OutputFileCheck c{"--points", "name,lat_deg,", true, {(d / "proj" / "design.yaml").string()}};
  CHECK(error_of([&] { check_output_file((d / "proj" / "design.yaml").string(), c); }).find("is the input file") !=
        std::string::npos);
  fs::remove_all(d);
}

TEST_CASE("output_file: an existing file is replaced only when it is empty, skein's kind, or with --overwrite") {
  const fs::path d = temp_dir();
  OutputFileCheck c{"--points", "name,lat_deg,", false, {}};
  CHECK(error_of([&] { check_output_file((d / "new.csv").string(), c); }).empty());
  put(d / "empty.csv", "");
  CHECK(error_of([&] { check_output_file((d / "empty.csv").string(), c); }).empty());
  put(d / "ours.csv", "name,lat_deg,lon_deg\n,1,2\n");
  CHECK(error_of([&] { check_output_file((d / "ours.csv").string(), c); }).empty());
  put(d / "theirs.csv", "id,value\n");
  CHECK(error_of([&] { check_output_file((d / "theirs.csv").string(), c); }).find("was not written by skein") !=
        std::string::npos);
  put(d / "short.csv", "name");  // shorter than the signature
  CHECK(!error_of([&] { check_output_file((d / "short.csv").string(), c); }).empty());
  c.overwrite = true;
  CHECK(error_of([&] { check_output_file((d / "theirs.csv").string(), c); }).empty());
  fs::create_directory(d / "dir.csv");
  CHECK(error_of([&] { check_output_file((d / "dir.csv").string(), c); }).find("is a folder") != std::string::npos);
  fs::remove_all(d);
}

TEST_CASE("folder_write: stale staging folders go only when name AND marker (or emptiness) say they are skein's") {
  const fs::path d = temp_dir();
  const std::string target = (d / "rep").string();
  // A dead process id: a child that has already exited and been reaped.
  const pid_t child = ::fork();
  REQUIRE(child >= 0);
  if (child == 0) ::_exit(0);
  int status = 0;
  ::waitpid(child, &status, 0);
  const std::string dead = std::to_string(child);
  put(d / (".rep.skein-staging-" + dead + "-aaaaaa") / ".skein-output", output_marker_text());  // stale: removed
  fs::create_directories(d / (".rep.skein-staging-" + dead + "-bbbbbb"));                        // empty: removed
  put(d / (".rep.skein-staging-" + dead + "-cccccc") / "user.txt", "x");                         // no marker: kept
  put(d / (".rep.skein-staging-" + std::to_string(::getpid()) + "-dddddd") / ".skein-output",
      output_marker_text());                                                                     // live run: kept
  put(d / ".rep.skein-staging-notapid" / ".skein-output", output_marker_text());                 // bad name: kept
  put(d / ".other.skein-staging-1-eeeeee" / ".skein-output", output_marker_text());              // other target: kept
  CHECK(remove_stale_staging(target) == 2);
  CHECK(!fs::exists(d / (".rep.skein-staging-" + dead + "-aaaaaa")));
  CHECK(!fs::exists(d / (".rep.skein-staging-" + dead + "-bbbbbb")));
  CHECK(fs::exists(d / (".rep.skein-staging-" + dead + "-cccccc") / "user.txt"));
  CHECK(fs::exists(d / (".rep.skein-staging-" + std::to_string(::getpid()) + "-dddddd")));
  CHECK(fs::exists(d / ".rep.skein-staging-notapid"));
  CHECK(fs::exists(d / ".other.skein-staging-1-eeeeee"));
  fs::remove_all(d);
}

TEST_CASE("folder_write: a writer destroyed before commit leaves the previous folder and no staging") {
  const fs::path d = temp_dir();
  write_folder_atomic((d / "rep").string(), {{"a.txt", "old"}});
  {
    FolderWriter w((d / "rep").string(), {});
    w.add("a.txt", "new");
  }
  CHECK(get(d / "rep" / "a.txt") == "old");
  CHECK(std::distance(fs::directory_iterator(d), fs::directory_iterator()) == 1);
  fs::remove_all(d);
}
