#pragma once
// MPI transport for `mpirun -n N skein sweep`: ranks take layouts round-robin, send each finished row to
// rank 0, which keeps the journal and writes the output files. Defined only when skein is built with MPI
// (SKEIN_HAVE_MPI); every MPI call of the project is in mpi_split.cpp.
#include <cstddef>
#include <functional>
#include <string>

namespace skein::mpi_split {

// True when the process was started by an MPI launcher (OpenMPI, MPICH/Hydra, PMIx or Slurm PMI variables).
bool launched();

// MPI initialised for the life of the object (thread level MPI_THREAD_SERIALIZED: worker threads send rows
// one at a time under a lock; on rank 0 only the main thread calls MPI).
class Session {
 public:
  Session();   // throws std::runtime_error when MPI cannot give MPI_THREAD_SERIALIZED
  ~Session();  // MPI_Finalize
  Session(const Session&) = delete;
  Session& operator=(const Session&) = delete;
  int rank() const { return rank_; }
  int size() const { return size_; }

 private:
  int rank_ = 0, size_ = 1;
};

// Rank 0's `data` replaces every other rank's.
void broadcast(std::string& data);
// To rank 0: one finished row, and the end of this rank's rows.
void send_row(size_t index, const std::string& row);
void send_done();
// On rank 0: receive rows from ranks 1..ranks-1 until each has sent done (polling, so that rank 0's own
// worker threads keep the cores). `sink` gets each row.
void receive_rows(int ranks, const std::function<void(size_t index, const std::string& row)>& sink);
// End every rank (after an error on one of them).
[[noreturn]] void abort(int code);

}  // namespace skein::mpi_split
