#pragma once
// The MPI rank group for `mpirun -n N skein sweep` (rank_group.hpp): ranks take layouts round-robin and send
// each finished row to rank 0, which keeps the journal and writes the output files. Defined only when skein is
// built with MPI (SKEIN_HAVE_MPI); every MPI call of the project is in mpi_split.cpp.
#include <cstddef>
#include <string>

#include "skein/sweep/rank_group.hpp"

namespace skein::mpi_split {

// True when the process was started by an MPI launcher (OpenMPI, MPICH/Hydra, PMIx or Slurm PMI variables).
bool launched();

// MPI initialised for the life of the object (thread level MPI_THREAD_SERIALIZED: worker threads send rows
// one at a time under a lock; on rank 0 only the main thread calls MPI).
class MpiRankGroup final : public RankGroup {
 public:
  MpiRankGroup();            // throws std::runtime_error when MPI cannot give MPI_THREAD_SERIALIZED
  ~MpiRankGroup() override;  // MPI_Finalize
  MpiRankGroup(const MpiRankGroup&) = delete;
  MpiRankGroup& operator=(const MpiRankGroup&) = delete;
  int rank() const override { return rank_; }
  int size() const override { return size_; }
  void broadcast_from_root(std::string& data) override;
  void send_row(size_t index, const std::string& row) override;
  void send_done() override;
  // Polls, so that rank 0's own worker threads keep the cores.
  void receive_rows(const RankRowSink& sink) override;
  [[noreturn]] void abort_all(int exit_code) override;  // MPI_Abort

 private:
  int rank_ = 0, size_ = 1;
};

}  // namespace skein::mpi_split
