#pragma once
// The processes a sweep is split over, seen by the sweep driver (sweep_driver.hpp): rank 0 keeps the journal and
// writes the outputs, every other rank evaluates its share and sends each finished row to rank 0. Two
// implementations: OneProcess (always built: rank 0 of 1, nothing to exchange) and, built only with MPI, the
// MPI one in mpi_split.hpp. The tests add an in-process group of several ranks on threads.
#include <cstddef>
#include <functional>
#include <memory>
#include <string>

namespace skein {

// Receives one finished row: the layout index and the encoded row (encode_row).
using RankRowSink = std::function<void(size_t index, const std::string& row)>;

class RankGroup {
 public:
  virtual ~RankGroup() = default;
  virtual int rank() const = 0;
  virtual int size() const = 0;
  // Every rank calls it; afterwards each holds rank 0's `data`.
  virtual void broadcast_from_root(std::string& data) = 0;
  // Ranks other than 0: one finished row to rank 0 (calls never overlap), then done once after the last row.
  virtual void send_row(size_t index, const std::string& row) = 0;
  virtual void send_done() = 0;
  // Rank 0: every row of the other ranks, handed to `sink` one at a time, until each of them has sent done.
  virtual void receive_rows(const RankRowSink& sink) = 0;
  // Ends every rank after an error on one of them (the error was already reported). An implementation that
  // cannot end the other processes throws instead.
  [[noreturn]] virtual void abort_all(int exit_code) = 0;
};

// One process alone: rank 0 of 1; there is nobody to exchange with.
class OneProcess final : public RankGroup {
 public:
  int rank() const override { return 0; }
  int size() const override { return 1; }
  void broadcast_from_root(std::string&) override {}
  void send_row(size_t, const std::string&) override;  // never called on rank 0: asserts
  void send_done() override;                           // likewise
  void receive_rows(const RankRowSink&) override {}
  [[noreturn]] void abort_all(int exit_code) override;  // std::_Exit
};

// The group this process belongs to: the MPI ranks when skein is built with MPI and was started by an MPI
// launcher (MPI is initialised for the life of the object), otherwise OneProcess.
std::unique_ptr<RankGroup> join_rank_group();

}  // namespace skein
