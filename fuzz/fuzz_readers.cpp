// fuzz/fuzz_readers.cpp — every reader target of fuzz/ in one libFuzzer program, which runs the
// one named by the environment variable LACUNA_FUZZ_TARGET (facets, cells, off, obj, netpbm,
// nrrd, points, distances, links, values).
//
// Why: compiling is most of what fuzzing costs CI. Each reader target instantiates the homology
// engine for the complex its reader returns, and most of them return the same few types; built
// as ten programs, the headers and the engine were compiled ten times (about 360 s of CPU with
// clang and the sanitizers), built as one, once (.ci/fuzz; docs/reliability.md). Each
// fuzz_<name>.cpp still builds alone as fuzz_<name>, for work on one reader.
//
// Each target file defines LLVMFuzzerTestOneInput and nothing else at file scope; it is
// included here with that name changed to lacuna_fuzz_<name>.
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>


#define LLVMFuzzerTestOneInput lacuna_fuzz_facets
#include "fuzz_facets.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_cells
#include "fuzz_cells.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_off
#include "fuzz_off.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_obj
#include "fuzz_obj.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_netpbm
#include "fuzz_netpbm.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_nrrd
#include "fuzz_nrrd.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_points
#include "fuzz_points.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_distances
#include "fuzz_distances.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_links
#include "fuzz_links.cpp"
#undef LLVMFuzzerTestOneInput
#define LLVMFuzzerTestOneInput lacuna_fuzz_values
#include "fuzz_values.cpp"
#undef LLVMFuzzerTestOneInput

namespace {

using fuzz_target = int (*)(const std::uint8_t*, std::size_t);

struct named_target {
  const char* name;
  fuzz_target run;
};

constexpr named_target targets[] = {
    {"facets", lacuna_fuzz_facets}, {"cells", lacuna_fuzz_cells},         {"off", lacuna_fuzz_off},
    {"obj", lacuna_fuzz_obj},       {"netpbm", lacuna_fuzz_netpbm},       {"nrrd", lacuna_fuzz_nrrd},
    {"points", lacuna_fuzz_points}, {"distances", lacuna_fuzz_distances}, {"links", lacuna_fuzz_links},
    {"values", lacuna_fuzz_values},
};

fuzz_target chosen = nullptr;

}  // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
  const char* name = std::getenv("LACUNA_FUZZ_TARGET");
  for (const auto& t : targets)
    if (name != nullptr && std::strcmp(name, t.name) == 0) chosen = t.run;
  if (chosen == nullptr) {
    std::fprintf(stderr, "fuzz_readers: set LACUNA_FUZZ_TARGET to one of:");
    for (const auto& t : targets) std::fprintf(stderr, " %s", t.name);
    std::fprintf(stderr, " (it is %s)\n", name != nullptr ? name : "not set");
    std::exit(2);
  }
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) { return chosen(data, size); }
