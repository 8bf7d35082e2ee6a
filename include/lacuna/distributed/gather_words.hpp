// lacuna/distributed/gather_words.hpp — the residuals of every rank gathered on the root, with
// the bytes counted (for the scale study) and failures reported on every rank.
#pragma once

#include <lacuna/distributed/collective_error.hpp>

#include <mpi.h>

#include <cstddef>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <vector>

namespace lacuna::distributed {

/// Payload bytes one rank sent and received over MPI in a distributed computation.
struct communication_counts {
  std::uint64_t bytes_sent = 0;      ///< bytes this rank sent
  std::uint64_t bytes_received = 0;  ///< bytes this rank received
};

/// Gathers every rank's words on `root` (MPI_Gather of the counts, then MPI_Gatherv), in rank
/// order; returns them on the root, an empty vector elsewhere. Collective over comm. Throws
/// distributed_error on every rank when the total does not fit the int counts of MPI
/// (2^31 - 1 words) or the root runs out of memory. Adds the payload bytes to `counts`.
inline std::vector<std::int64_t> gather_words(MPI_Comm comm, int root, const std::vector<std::int64_t>& words,
                                              communication_counts& counts) {
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  const int count = collective_phase(comm, "sending its residual", [&] {
    if (words.size() > static_cast<std::size_t>(std::numeric_limits<int>::max()))
      throw std::length_error("its residual exceeds 2^31 - 1 words (use more ranks or more blocks per rank)");
    return static_cast<int>(words.size());
  });
  std::vector<int> sizes(rank == root ? static_cast<std::size_t>(size) : 0), displs;
  check_mpi(MPI_Gather(&count, 1, MPI_INT, sizes.data(), 1, MPI_INT, root, comm), "MPI_Gather (residual sizes)");
  std::vector<std::int64_t> all;
  std::size_t total = 0;
  collective_phase(comm, "receiving the residuals", [&] {
    if (rank != root) return;
    for (int c : sizes) total += static_cast<std::size_t>(c);
    if (total > static_cast<std::size_t>(std::numeric_limits<int>::max()))
      throw std::length_error("the residuals exceed 2^31 - 1 words on the root (use a tree of roots)");
    displs.resize(static_cast<std::size_t>(size));
    for (std::size_t i = 0, d = 0; i < sizes.size(); d += static_cast<std::size_t>(sizes[i]), ++i) displs[i] = static_cast<int>(d);
    all.resize(total);
  });
  check_mpi(MPI_Gatherv(words.data(), count, MPI_INT64_T, all.data(), sizes.data(), displs.data(), MPI_INT64_T, root, comm),
            "MPI_Gatherv (residuals)");
  counts.bytes_sent += sizeof(int) + words.size() * sizeof(std::int64_t);
  if (rank == root) counts.bytes_received += sizes.size() * sizeof(int) + total * sizeof(std::int64_t);
  return all;
}

}  // namespace lacuna::distributed
