// Evidence for lib/skein/sweep/sweep_driver: the whole sweep run over a rank group. A small trade of the demo
// design run by one process is the reference; three ranks on threads
// (thread_ranks.hpp, the exchange without MPI) and resumed runs must write the same files byte for byte, each
// pending layout evaluated by exactly the rank round_robin_share gives it, and the finished ones by none.
#include <doctest/doctest.h>

#include <stdlib.h>

#include <algorithm>
#include <exception>
#include <filesystem>
#include <fstream>
#include <map>
#include <numeric>
#include <optional>
#include <set>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "skein/error.hpp"
#include "skein/input/sweep_file.hpp"
#include "skein/sweep/journal.hpp"
#include "skein/sweep/sweep_driver.hpp"
#include "skein/sweep/sweep_run.hpp"
#include "thread_ranks.hpp"

namespace fs = std::filesystem;
using namespace skein;
using skein::testing::ThreadRank;
using skein::testing::ThreadRanksAborted;
using skein::testing::ThreadRanksHub;

namespace {

const std::vector<std::string> output_files = {"results.csv", "results.jsonl", "best_front.csv", "trade_front.csv",
                                               "fronts.svg"};

// Every folder of these cases is made under one temporary root, removed when the test program ends.
struct TempRoot {
  fs::path path;
  TempRoot() {
    std::string tmpl = (fs::temp_directory_path() / "skein-driver-XXXXXX").string();
    if (::mkdtemp(tmpl.data()) != nullptr) path = tmpl;
  }
  ~TempRoot() {
    std::error_code ec;
    if (!path.empty()) fs::remove_all(path, ec);
  }
};

fs::path temp_dir() {
  static TempRoot root;
  static int made = 0;
  REQUIRE(!root.path.empty());
  const fs::path p = root.path / std::to_string(++made);
  fs::create_directory(p);
  return p;
}

std::string get(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

std::vector<std::string> lines_of(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string l; std::getline(in, l);) out.push_back(l);
  return out;
}

// A small trade of the demo design's imaging shell (16 layouts, a coarse grid, 3 h), written once: small enough
// that each case below, which runs it several times, takes seconds.
const std::string& sweep_file() {
  static const std::string path = [] {
    const fs::path p = temp_dir() / "driver-trade.yaml";
    std::ofstream(p) << "name: Driver test trade\n"
                        "base: " << SKEIN_SOURCE_DIR << "/designs/demo.yaml\n"
                        "shell: imaging\n"
                        "coverage:\n  grid:\n    kind: global\n    spacing_deg: 15\n  span_h: 3\n  step_s: 120\n"
                        "axes:\n  satellites: [12, 18]\n  planes: [3]\n  phasing: [0, 1, 3]\n"
                        "  altitude_km: [520, 580]\n  inclination_deg: [sun-synchronous, 70]\n  ltan: [\"10:30\"]\n"
                        "requirement:\n  fold: 1\n  min_percent_covered: 43\n"
                        "cost: [satellites, fleet_dv_m_s]\n";
    return p.string();
  }();
  return path;
}

SweepRunOptions options_for(const fs::path& out, bool resume = false) {
  SweepRunOptions o;
  o.folder.sweep_file = sweep_file();
  o.read_sweep = [](const std::string& file) { return read_sweep_file(file); };
  o.folder.resume = resume;
  o.out_dir = out.string();
  return o;
}

struct RankRun {
  SweepRunResult result;
  std::exception_ptr error;
  std::optional<size_t> pending;  // from the started hook (rank 0)
  int plan_ranks = 0;
  long rows_kept = 0;
  std::vector<std::string> ending;  // what the ending_all hook got
};

std::vector<RankRun> run_ranks(ThreadRanksHub& hub, const SweepRunOptions& options) {
  std::vector<RankRun> out(static_cast<size_t>(hub.ranks()));
  std::vector<std::thread> threads;
  for (int r = 0; r < hub.ranks(); ++r)
    threads.emplace_back([&, r] {
      RankRun& mine = out[static_cast<size_t>(r)];
      ThreadRank group(hub, r);
      SweepRunHooks hooks;
      hooks.started = [&](const SweepPlan& p) {
        mine.pending = p.pending;
        mine.plan_ranks = p.ranks;
      };
      hooks.row_kept = [&] { ++mine.rows_kept; };
      hooks.ending_all = [&](int rank, const std::string& what) {
        mine.ending.push_back(std::to_string(rank) + ": " + what);
      };
      try {
        mine.result = run_sweep(options, group, hooks);
      } catch (...) {
        mine.error = std::current_exception();
      }
    });
  for (std::thread& t : threads) t.join();
  return out;
}

// The reference: one process, from scratch, once for all the cases below.
struct Reference {
  fs::path dir;
  size_t layouts = 0;
  std::map<std::string, std::string> files;
  std::vector<std::string> journal;  // header, then one line per layout in the order they finished
};

const Reference& reference() {
  static const Reference ref = [] {
    Reference r;
    r.dir = temp_dir() / "one";
    OneProcess group;
    size_t pending = 0;
    SweepRunHooks hooks;
    hooks.started = [&](const SweepPlan& p) { pending = p.pending; };
    const SweepRunResult result = run_sweep(options_for(r.dir), group, hooks);
    REQUIRE(result.role == SweepRole::wrote_outputs);
    r.layouts = result.set.layouts.size();
    REQUIRE(pending == r.layouts);
    REQUIRE(result.written == output_files);
    for (const std::string& f : output_files) r.files[f] = get(r.dir / f);
    r.journal = lines_of(get(r.dir / "journal.txt"));
    return r;
  }();
  return ref;
}

void check_same_files(const fs::path& dir) {
  for (const std::string& f : output_files) {
    INFO(f);
    CHECK(get(dir / f) == reference().files.at(f));
  }
}

// A copy of the reference folder whose journal keeps its header and first `keep` rows, then half a line (a
// write cut short by a kill).
fs::path cut_copy(size_t keep) {
  const fs::path dir = temp_dir() / "cut";
  fs::copy(reference().dir, dir);
  std::string text;
  for (size_t k = 0; k <= keep; ++k) text += reference().journal[k] + "\n";
  text += reference().journal[keep + 1].substr(0, 20);
  std::ofstream(dir / "journal.txt", std::ios::binary | std::ios::trunc) << text;
  for (const std::string& f : output_files) fs::remove(dir / f);
  return dir;
}

// The layout indices of journal lines 1..keep (the finished rows of a cut copy).
std::set<size_t> journaled(size_t keep) {
  std::set<size_t> out;
  for (size_t k = 1; k <= keep; ++k) out.insert(std::stoul(reference().journal[k]));
  return out;
}

}  // namespace

TEST_CASE("sweep driver: one process journals every layout once and writes the five files") {
  const Reference& ref = reference();
  // The test trade's valid layouts, counted by hand from its axes: T 12 and 18 with P = 3 (both divide);
  // phasing 0 and 1 (3 is outside 0..P-1); 2 altitudes; 2 inclination choices = 16. Each is journaled once.
  CHECK(ref.layouts == 16);
  REQUIRE(ref.journal.size() == ref.layouts + 1);
  std::set<size_t> seen;
  for (size_t k = 1; k < ref.journal.size(); ++k) seen.insert(std::stoul(ref.journal[k]));
  CHECK(seen.size() == ref.layouts);
  CHECK(*seen.rbegin() == ref.layouts - 1);
  for (const std::string& f : output_files) CHECK(!ref.files.at(f).empty());
}

TEST_CASE("sweep driver: three ranks on threads write the same files, byte for byte, as one process") {
  const Reference& ref = reference();
  const fs::path dir = temp_dir() / "three";
  ThreadRanksHub hub(3);
  const std::vector<RankRun> runs = run_ranks(hub, options_for(dir));
  for (const RankRun& r : runs) CHECK(!r.error);
  CHECK(runs[0].result.role == SweepRole::wrote_outputs);
  CHECK(runs[1].result.role == SweepRole::sent_rows);
  CHECK(runs[2].result.role == SweepRole::sent_rows);
  CHECK(hub.abort_code() == 0);
  REQUIRE(runs[0].pending);
  CHECK(*runs[0].pending == ref.layouts);
  CHECK(runs[0].plan_ranks == 3);
  CHECK(runs[0].rows_kept == static_cast<long>(ref.layouts));
  check_same_files(dir);

  // The split, against a brute force of the round-robin rule: rank r sends layouts r, r+3, r+6, ... and
  // nothing twice; rank 0 evaluates the rest (those nobody sent), which are its own share.
  std::vector<size_t> all(ref.layouts);
  std::iota(all.begin(), all.end(), size_t{0});
  const auto sent = hub.sent();
  std::set<size_t> sent_by_others;
  for (int r = 1; r < 3; ++r) {
    std::vector<size_t> mine = sent.at(r);
    std::sort(mine.begin(), mine.end());
    CHECK(mine == round_robin_share(all, r, 3));
    sent_by_others.insert(mine.begin(), mine.end());
  }
  CHECK(sent.count(0) == 0);
  std::vector<size_t> rank0;
  for (size_t i = 0; i < ref.layouts; ++i)
    if (!sent_by_others.count(i)) rank0.push_back(i);
  CHECK(rank0 == round_robin_share(all, 0, 3));

  // The journal holds the same lines as one process's, in the order the rows arrived.
  std::vector<std::string> a = ref.journal, b = lines_of(get(dir / "journal.txt"));
  REQUIRE(!b.empty());
  CHECK(a.front() == b.front());
  std::sort(a.begin(), a.end());
  std::sort(b.begin(), b.end());
  CHECK(a == b);
}

TEST_CASE("sweep driver: a journal cut after 6 rows is resumed with only the other layouts evaluated") {
  const Reference& ref = reference();
  const size_t keep = 6;
  const std::set<size_t> done = journaled(keep);
  REQUIRE(done.size() == keep);

  SUBCASE("one process") {
    const fs::path dir = cut_copy(keep);
    OneProcess group;
    size_t pending = 0;
    long kept = 0;
    SweepRunHooks hooks;
    hooks.started = [&](const SweepPlan& p) { pending = p.pending; };
    hooks.row_kept = [&] { ++kept; };
    const SweepRunResult r = run_sweep(options_for(dir, true), group, hooks);
    CHECK(r.role == SweepRole::wrote_outputs);
    CHECK(pending == ref.layouts - keep);
    CHECK(kept == static_cast<long>(ref.layouts - keep));
    CHECK(r.resumed == static_cast<long>(keep));
    CHECK(r.damaged_lines == 1);  // the half line
    check_same_files(dir);
    // The journal's first 7 lines are the kept ones, unchanged (rewritten in place, then appended to).
    const std::vector<std::string> j = lines_of(get(dir / "journal.txt"));
    REQUIRE(j.size() == ref.layouts + 1);
    CHECK(std::equal(j.begin(), j.begin() + static_cast<long>(keep) + 1, ref.journal.begin()));
  }
  SUBCASE("three ranks on threads") {
    const fs::path dir = cut_copy(keep);
    ThreadRanksHub hub(3);
    const std::vector<RankRun> runs = run_ranks(hub, options_for(dir, true));
    for (const RankRun& r : runs) CHECK(!r.error);
    REQUIRE(runs[0].pending);
    CHECK(*runs[0].pending == ref.layouts - keep);
    CHECK(runs[0].result.resumed == static_cast<long>(keep));
    check_same_files(dir);
    // Only pending layouts were sent, each by the rank the round-robin rule over the pending list gives.
    std::vector<size_t> pending;
    for (size_t i = 0; i < ref.layouts; ++i)
      if (!done.count(i)) pending.push_back(i);
    const auto sent = hub.sent();
    for (int r = 1; r < 3; ++r) {
      std::vector<size_t> mine = sent.at(r);
      std::sort(mine.begin(), mine.end());
      CHECK(mine == round_robin_share(pending, r, 3));
    }
  }
}

TEST_CASE("sweep driver: a rank that fails ends every rank and no result file is written") {
  reference();  // not needed, but keeps the reference's run out of the threads below
  const fs::path dir = temp_dir() / "fail";
  ThreadRanksHub hub(3);
  hub.fail_send(2, 1);  // rank 2's second row cannot be sent
  const std::vector<RankRun> runs = run_ranks(hub, options_for(dir));
  // Rank 2 reports its own error and ends the group with status 3 (internal), as the MPI group would.
  REQUIRE(runs[2].error);
  CHECK(runs[2].ending == std::vector<std::string>{"2: simulated lost connection"});
  CHECK(hub.abort_code() == 3);
  // Rank 0, waiting for rows, is ended too; it writes nothing but the journal of the rows it kept.
  REQUIRE(runs[0].error);
  CHECK_THROWS_AS(std::rethrow_exception(runs[0].error), ThreadRanksAborted);
  for (const std::string& f : output_files) CHECK(!fs::exists(dir / f));
  CHECK(fs::exists(dir / "journal.txt"));
}

TEST_CASE("sweep driver: a folder refused on rank 0 stops every rank before any layout is evaluated") {
  const fs::path dir = temp_dir() / "foreign";
  fs::create_directories(dir);
  std::ofstream(dir / "notes.txt") << "someone else's file\n";
  ThreadRanksHub hub(3);
  const std::vector<RankRun> runs = run_ranks(hub, options_for(dir));
  REQUIRE(runs[0].error);
  std::string message;
  try {
    std::rethrow_exception(runs[0].error);
  } catch (const InputError& e) {
    message = e.what();
  }
  CHECK(message.find("was not written by skein") != std::string::npos);
  CHECK(!runs[0].pending);  // never started
  for (int r = 1; r < 3; ++r) {
    CHECK(!runs[static_cast<size_t>(r)].error);
    CHECK(runs[static_cast<size_t>(r)].result.role == SweepRole::root_reports);
  }
  CHECK(hub.sent().empty());
  // Nothing changed: the folder holds the one file it had.
  CHECK(std::distance(fs::directory_iterator(dir), fs::directory_iterator{}) == 1);
}

TEST_CASE("sweep driver: a bad sweep file is reported by rank 0 alone") {
  const fs::path dir = temp_dir();
  const fs::path bad = dir / "bad.yaml";
  std::ofstream(bad) << "name: x\nbase: nowhere.yaml\n";
  SweepRunOptions o = options_for(dir / "out");
  o.folder.sweep_file = bad.string();
  ThreadRanksHub hub(2);
  const std::vector<RankRun> runs = run_ranks(hub, o);
  REQUIRE(runs[0].error);
  CHECK_THROWS_AS(std::rethrow_exception(runs[0].error), InputError);
  CHECK(!runs[1].error);
  CHECK(runs[1].result.role == SweepRole::root_reports);
  CHECK(!fs::exists(dir / "out"));
}

TEST_CASE("sweep driver: the summary names the counts, the cheapest layout and the files") {
  const Reference& ref = reference();
  OneProcess group;
  const fs::path dir = cut_copy(ref.layouts - 1);  // every row but the last one journaled
  const SweepRunResult r = run_sweep(options_for(dir, true), group);
  const std::string text = sweep_summary_text(r);
  REQUIRE(r.outputs.summary.cheapest_meeting);
  CHECK(text.rfind("sweep Driver test trade: 16 layouts (15 resumed from the journal, 1 damaged or repeated "
                   "journal lines dropped), ",
                   0) == 0);
  CHECK(text.find("\ncheapest layout meeting the requirement: " +
                  std::to_string(r.outputs.summary.cheapest_meeting->layout) + " (") != std::string::npos);
  CHECK(text.find("written: " + dir.string() +
                  "/results.csv, results.jsonl, best_front.csv, trade_front.csv, fronts.svg\n") != std::string::npos);
}
