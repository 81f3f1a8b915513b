#include "skein/sweep/rank_group.hpp"

#include <cassert>
#include <cstdlib>

#ifdef SKEIN_HAVE_MPI
#include "skein/sweep/mpi_split.hpp"
#endif

namespace skein {

void OneProcess::send_row(size_t, const std::string&) { assert(!"one process: rank 0 sends no rows"); }
void OneProcess::send_done() { assert(!"one process: rank 0 sends no rows"); }
void OneProcess::abort_all(int exit_code) { std::_Exit(exit_code); }

std::unique_ptr<RankGroup> join_rank_group() {
#ifdef SKEIN_HAVE_MPI
  if (mpi_split::launched()) return std::make_unique<mpi_split::MpiRankGroup>();
#endif
  return std::make_unique<OneProcess>();
}

}  // namespace skein
