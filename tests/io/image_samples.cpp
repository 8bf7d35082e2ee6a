// Tests of read_netpbm_samples and read_nrrd_samples (lacuna/io/netpbm.hpp, io/nrrd.hpp): the
// samples of an image or volume, for sublevel and superlevel filtrations. Expected samples are
// the numbers written in the files (tests/data/image/gradient.pgm holds 0..9 in two rows), or
// the bytes written by the test itself; errors are those of the complex readers.
#include <doctest/doctest.h>

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/netpbm.hpp>
#include <lacuna/io/nrrd.hpp>

#include <array>
#include <cstdint>
#include <filesystem>
#include <sstream>
#include <string>
#include <vector>

namespace image_samples_test {
inline std::string samples_data(const char* name) { return std::string(LACUNA_TEST_DATA_DIR) + "/image/" + name; }
}  // namespace image_samples_test

TEST_CASE("samples of PGM and PBM images") {
  using namespace image_samples_test;
  const auto [extents, samples] = lacuna::io::read_netpbm_samples(std::filesystem::path(samples_data("gradient.pgm")));
  CHECK(extents == std::array<std::size_t, 2>{5, 2});
  CHECK(samples == std::vector<std::int32_t>{0, 1, 2, 3, 4, 5, 6, 7, 8, 9});  // as written in the file
  // P5 with 16-bit big-endian samples: 0x0102 = 258 and 0xFFFF = 65535
  std::istringstream p5(std::string("P5 2 1 65535\n\x01\x02\xFF\xFF", 17));
  CHECK(lacuna::io::read_netpbm_samples(p5, "p5.pgm").second == std::vector<std::int32_t>{258, 65535});
  // P1: black is 1
  std::istringstream p1("P1 3 1\n1 0 1\n");
  CHECK(lacuna::io::read_netpbm_samples(p1, "p1.pbm").second == std::vector<std::int32_t>{1, 0, 1});
  // the errors of the complex reader
  CHECK_THROWS_AS(lacuna::io::read_netpbm_samples(std::filesystem::path(samples_data("truncated.pgm"))), lacuna::parse_error);
  CHECK_THROWS_AS(lacuna::io::read_netpbm_samples(std::filesystem::path(samples_data("sample_above_maxval.pgm"))),
                  lacuna::parse_error);
}

TEST_CASE("samples of NRRD volumes") {
  using namespace image_samples_test;
  const auto [extents, samples] = lacuna::io::read_nrrd_samples<3>(std::filesystem::path(samples_data("hollow.nrrd")));
  CHECK(extents == std::array<std::size_t, 3>{3, 3, 3});
  REQUIRE(samples.size() == 27);
  CHECK(samples[13] == 0);  // the centre of the shell
  CHECK(samples[0] == 1);
  // signed 16-bit little-endian samples: -2 and 300; a 2D volume gets a third extent of 1
  std::istringstream v(std::string("NRRD0004\ntype: int16\ndimension: 2\nsizes: 2 1\nendian: little\nencoding: raw\n\n"
                                   "\xFE\xFF\x2C\x01",
                                   79));
  const auto [e2, s2] = lacuna::io::read_nrrd_samples<3>(v, "v.nrrd");
  CHECK(e2 == std::array<std::size_t, 3>{2, 1, 1});
  CHECK(s2 == std::vector<std::int32_t>{-2, 300});
  CHECK_THROWS_AS(lacuna::io::read_nrrd_samples<3>(std::filesystem::path(samples_data("truncated.nrrd"))), lacuna::parse_error);
}
