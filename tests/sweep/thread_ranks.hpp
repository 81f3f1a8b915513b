#pragma once
// A rank group for the tests (rank_group.hpp): N ranks of one process, each run on its own thread, exchanging
// through a shared hub instead of MPI, so the split, the status broadcast and the row exchange of
// sweep_driver.cpp run without an MPI launcher. abort_all cannot end threads: it marks the hub aborted (every
// rank blocked in an exchange then throws) and throws ThreadRanksAborted.
#include <condition_variable>
#include <cstddef>
#include <deque>
#include <map>
#include <mutex>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "skein/sweep/rank_group.hpp"

namespace skein::testing {

struct ThreadRanksAborted : std::runtime_error {
  int exit_code;
  explicit ThreadRanksAborted(int code) : std::runtime_error("rank group aborted"), exit_code(code) {}
};

class ThreadRanksHub {
 public:
  explicit ThreadRanksHub(int ranks) : ranks_(ranks) {}
  int ranks() const { return ranks_; }

  // What each rank sent (layout indices, in order sent), and the exit code of the first abort (0: none).
  std::map<int, std::vector<size_t>> sent() const {
    std::lock_guard<std::mutex> lock(m_);
    return sent_;
  }
  int abort_code() const {
    std::lock_guard<std::mutex> lock(m_);
    return abort_code_;
  }
  // Makes rank `rank`'s n-th row (from 0) fail to send, as a broken connection would.
  void fail_send(int rank, size_t nth) { fail_ = {rank, nth}; }

 private:
  friend class ThreadRank;
  int ranks_;
  mutable std::mutex m_;
  std::condition_variable cv_;
  std::vector<std::string> broadcasts_;
  std::deque<std::pair<size_t, std::string>> queue_;
  std::map<int, std::vector<size_t>> sent_;
  int done_ = 0;
  int abort_code_ = 0;
  std::pair<int, size_t> fail_{-1, 0};
};

class ThreadRank final : public RankGroup {
 public:
  ThreadRank(ThreadRanksHub& hub, int rank) : hub_(hub), rank_(rank) {}
  int rank() const override { return rank_; }
  int size() const override { return hub_.ranks_; }

  void broadcast_from_root(std::string& data) override {
    std::unique_lock<std::mutex> lock(hub_.m_);
    if (rank_ == 0) {
      hub_.broadcasts_.push_back(data);
      hub_.cv_.notify_all();
    } else {
      hub_.cv_.wait(lock, [&] { return hub_.abort_code_ != 0 || hub_.broadcasts_.size() > broadcasts_seen_; });
      if (hub_.abort_code_ != 0) throw ThreadRanksAborted(hub_.abort_code_);
      data = hub_.broadcasts_[broadcasts_seen_];
    }
    ++broadcasts_seen_;
  }

  void send_row(size_t index, const std::string& row) override {
    std::lock_guard<std::mutex> lock(hub_.m_);
    if (hub_.fail_.first == rank_ && hub_.sent_[rank_].size() == hub_.fail_.second)
      throw std::runtime_error("simulated lost connection");
    hub_.sent_[rank_].push_back(index);
    hub_.queue_.emplace_back(index, row);
    hub_.cv_.notify_all();
  }

  void send_done() override {
    std::lock_guard<std::mutex> lock(hub_.m_);
    ++hub_.done_;
    hub_.cv_.notify_all();
  }

  void receive_rows(const RankRowSink& sink) override {
    for (;;) {
      std::pair<size_t, std::string> item;
      {
        std::unique_lock<std::mutex> lock(hub_.m_);
        hub_.cv_.wait(lock, [&] {
          return hub_.abort_code_ != 0 || !hub_.queue_.empty() || hub_.done_ == hub_.ranks_ - 1;
        });
        if (hub_.abort_code_ != 0) throw ThreadRanksAborted(hub_.abort_code_);
        if (hub_.queue_.empty()) return;  // every other rank sent done
        item = std::move(hub_.queue_.front());
        hub_.queue_.pop_front();
      }
      sink(item.first, item.second);
    }
  }

  [[noreturn]] void abort_all(int exit_code) override {
    {
      std::lock_guard<std::mutex> lock(hub_.m_);
      if (hub_.abort_code_ == 0) hub_.abort_code_ = exit_code;
      hub_.cv_.notify_all();
    }
    throw ThreadRanksAborted(exit_code);
  }

 private:
  ThreadRanksHub& hub_;
  int rank_;
  size_t broadcasts_seen_ = 0;
};

}  // namespace skein::testing
