// Evidence for lib/skein/io/atomic_write: a writer killed with SIGKILL part-way leaves no partial file under
// the target's name (the old file, when there was one, stays whole); only a hidden temporary may remain.
// The property follows from POSIX rename(2) replacing the target atomically (IEEE Std 1003.1, rename()).
#include <doctest/doctest.h>

#include <fcntl.h>
#include <signal.h>
#include <stdlib.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"

namespace fs = std::filesystem;

namespace {

std::string read_all(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

fs::path make_temp_dir() {
  std::string tmpl = (fs::temp_directory_path() / "skein-atomic-XXXXXX").string();
  REQUIRE(::mkdtemp(tmpl.data()) != nullptr);
  return tmpl;
}

struct KillOutcome {
  bool killed_midway = false;             // the child was killed before it finished
  std::vector<std::string> leftovers;     // names in the folder other than the target after the kill
};

// Fork a child that writes `content` to dir/target atomically; kill it with SIGKILL as soon as its temporary
// file holds some but not all bytes.
KillOutcome kill_writer_midway(const fs::path& dir, const std::string& target, const std::string& content) {
  const fs::path target_path = dir / target;
  const pid_t pid = ::fork();
  REQUIRE(pid >= 0);
  if (pid == 0) {
    try {
      skein::write_file_atomic(target_path.string(), content);
    } catch (...) {
      ::_exit(1);
    }
    ::_exit(0);
  }
  KillOutcome out;
  const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(60);
  while (std::chrono::steady_clock::now() < deadline) {
    bool partial = false;
    std::error_code ec;
    for (const auto& entry : fs::directory_iterator(dir, ec)) {
      if (entry.path().filename() == target) continue;
      const auto size = entry.file_size(ec);
      if (!ec && size > 0 && size < content.size()) partial = true;
    }
    int status = 0;
    if (::waitpid(pid, &status, WNOHANG) == pid) return out;  // finished before we could kill it
    if (partial) {
      ::kill(pid, SIGKILL);
      ::waitpid(pid, &status, 0);
      out.killed_midway = WIFSIGNALED(status) && WTERMSIG(status) == SIGKILL;
      break;
    }
    std::this_thread::sleep_for(std::chrono::microseconds(200));
  }
  if (!out.killed_midway) {
    ::kill(pid, SIGKILL);
    int status = 0;
    ::waitpid(pid, &status, 0);
  }
  for (const auto& entry : fs::directory_iterator(dir))
    if (entry.path().filename() != target) out.leftovers.push_back(entry.path().filename().string());
  return out;
}

// Content large enough that writing it takes a while; grown until the kill lands part-way.
KillOutcome kill_with_growing_content(const fs::path& dir, const std::string& target) {
  KillOutcome out;
  for (size_t mib = 64; mib <= 512 && !out.killed_midway; mib *= 2) {
    std::error_code ec;
    fs::remove(dir / target, ec);
    const std::string content(mib << 20, 'k');
    out = kill_writer_midway(dir, target, content);
  }
  return out;
}

void check_leftovers_are_hidden_temporaries(const KillOutcome& out, const std::string& target) {
  CHECK(out.leftovers.size() <= 1);
  for (const auto& name : out.leftovers) {
    CHECK(name != target);
    CHECK(name.rfind("." + target + ".tmp-", 0) == 0);  // the temporary's pattern in atomic_write.cpp
  }
}

}  // namespace

TEST_CASE("atomic_write: a writer killed midway leaves no file under the target name") {
  const fs::path dir = make_temp_dir();
  const KillOutcome out = kill_with_growing_content(dir, "satellites.csv");
  REQUIRE(out.killed_midway);
  CHECK_FALSE(fs::exists(dir / "satellites.csv"));
  check_leftovers_are_hidden_temporaries(out, "satellites.csv");
  fs::remove_all(dir);
}

TEST_CASE("atomic_write: a writer killed midway leaves the previous file whole") {
  const fs::path dir = make_temp_dir();
  const std::string old_content = "design,epoch\nKestrel,2027-03-01T00:00:00Z\n";
  skein::write_file_atomic((dir / "report.csv").string(), old_content);
  REQUIRE(read_all(dir / "report.csv") == old_content);
  // Kill a second writer part-way: the old file must be untouched, byte for byte.
  KillOutcome out;
  for (size_t mib = 64; mib <= 512 && !out.killed_midway; mib *= 2)
    out = kill_writer_midway(dir, "report.csv", std::string(mib << 20, 'k'));
  REQUIRE(out.killed_midway);
  CHECK(read_all(dir / "report.csv") == old_content);
  check_leftovers_are_hidden_temporaries(out, "report.csv");
  fs::remove_all(dir);
}

TEST_CASE("atomic_write: a finished write replaces the file whole and leaves no temporary") {
  const fs::path dir = make_temp_dir();
  const std::string content(3u << 20, 'x');
  skein::write_file_atomic((dir / "out.json").string(), "old");
  skein::write_file_atomic((dir / "out.json").string(), content);
  CHECK(read_all(dir / "out.json") == content);
  size_t entries = 0;
  for ([[maybe_unused]] const auto& e : fs::directory_iterator(dir)) ++entries;
  CHECK(entries == 1);
  CHECK_THROWS_AS(skein::write_file_atomic((dir / "no-such-folder" / "x.csv").string(), "x"), skein::InputError);
  fs::remove_all(dir);
}
