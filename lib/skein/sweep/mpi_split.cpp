// Compiled into the library always (the CMake glob takes every .cpp); the content only with MPI.
#ifdef SKEIN_HAVE_MPI
#include "skein/sweep/mpi_split.hpp"

// Only the C API is used: leave out the deprecated C++ bindings (their headers warn under -Wextra).
#define OMPI_SKIP_MPICXX 1
#define MPICH_SKIP_MPICXX 1
#include <mpi.h>

#include <chrono>
#include <cstdlib>
#include <cstring>
#include <stdexcept>
#include <thread>
#include <vector>

namespace skein::mpi_split {
namespace {

constexpr int tag_row = 1;
constexpr int tag_done = 2;

}  // namespace

bool launched() {
  for (const char* v : {"OMPI_COMM_WORLD_SIZE", "PMI_SIZE", "PMIX_RANK", "PMI_RANK", "MPI_LOCALNRANKS"})
    if (std::getenv(v)) return true;
  return false;
}

MpiRankGroup::MpiRankGroup() {
  int provided = 0;
  MPI_Init_thread(nullptr, nullptr, MPI_THREAD_SERIALIZED, &provided);
  if (provided < MPI_THREAD_SERIALIZED) {
    MPI_Finalize();
    throw std::runtime_error("the MPI library does not provide MPI_THREAD_SERIALIZED, which skein sweep needs");
  }
  MPI_Comm_rank(MPI_COMM_WORLD, &rank_);
  MPI_Comm_size(MPI_COMM_WORLD, &size_);
}

MpiRankGroup::~MpiRankGroup() { MPI_Finalize(); }

void MpiRankGroup::broadcast_from_root(std::string& data) {
  unsigned long long n = data.size();
  MPI_Bcast(&n, 1, MPI_UNSIGNED_LONG_LONG, 0, MPI_COMM_WORLD);
  data.resize(static_cast<size_t>(n));
  // Sent in pieces below INT_MAX bytes.
  size_t done = 0;
  while (done < data.size()) {
    const int piece = static_cast<int>(std::min<size_t>(data.size() - done, 1U << 30));
    MPI_Bcast(data.data() + done, piece, MPI_CHAR, 0, MPI_COMM_WORLD);
    done += static_cast<size_t>(piece);
  }
}

void MpiRankGroup::send_row(size_t index, const std::string& row) {
  std::vector<char> buf(sizeof(unsigned long long) + row.size());
  const unsigned long long i = index;
  std::memcpy(buf.data(), &i, sizeof i);
  std::memcpy(buf.data() + sizeof i, row.data(), row.size());
  MPI_Send(buf.data(), static_cast<int>(buf.size()), MPI_CHAR, 0, tag_row, MPI_COMM_WORLD);
}

void MpiRankGroup::send_done() { MPI_Send(nullptr, 0, MPI_CHAR, 0, tag_done, MPI_COMM_WORLD); }

void MpiRankGroup::receive_rows(const RankRowSink& sink) {
  int remaining = size_ - 1;
  std::vector<char> buf;
  while (remaining > 0) {
    int flag = 0;
    MPI_Status st;
    MPI_Iprobe(MPI_ANY_SOURCE, MPI_ANY_TAG, MPI_COMM_WORLD, &flag, &st);
    if (!flag) {
      std::this_thread::sleep_for(std::chrono::milliseconds(2));
      continue;
    }
    int count = 0;
    MPI_Get_count(&st, MPI_CHAR, &count);
    buf.resize(static_cast<size_t>(count));
    MPI_Recv(buf.data(), count, MPI_CHAR, st.MPI_SOURCE, st.MPI_TAG, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
    if (st.MPI_TAG == tag_done) {
      --remaining;
      continue;
    }
    unsigned long long i = 0;
    if (buf.size() < sizeof i) abort_all(3);
    std::memcpy(&i, buf.data(), sizeof i);
    sink(static_cast<size_t>(i), std::string(buf.data() + sizeof i, buf.size() - sizeof i));
  }
}

void MpiRankGroup::abort_all(int exit_code) {
  MPI_Abort(MPI_COMM_WORLD, exit_code);
  std::_Exit(exit_code);
}

}  // namespace skein::mpi_split
#endif
