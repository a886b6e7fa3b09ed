// io/h5 on its own: failures become exceptions naming file and object (and HDF5 prints nothing),
// chunk shapes stay under the target size with whole x-rows, slab writes land where they should.
#include "io/h5.h"

#include <gtest/gtest.h>
#include <unistd.h>

#include <complex>
#include <cstdint>
#include <filesystem>
#include <functional>
#include <numeric>
#include <string>
#include <vector>

namespace fs = std::filesystem;
using namespace yeegap::io;

namespace {

class H5 : public ::testing::Test {
 protected:
  void SetUp() override {
    const auto* info = ::testing::UnitTest::GetInstance()->current_test_info();
    dir_ = fs::temp_directory_path() / ("yeegap_h5_" + std::to_string(::getpid()) + "_" + info->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
  }
  void TearDown() override {
    std::error_code ec;
    fs::remove_all(dir_, ec);
  }
  fs::path dir_;
};

std::string message_of(const std::function<void()>& action) {
  try {
    action();
  } catch (const std::runtime_error& e) {
    return e.what();
  }
  return "<no exception>";
}

TEST_F(H5, OpeningAMissingFileThrowsNamingItAndPrintsNothing) {
  const std::string path = (dir_ / "missing.h5").string();
  ::testing::internal::CaptureStderr();
  const std::string what = message_of([&] { h5::File::open(path); });
  const std::string printed = ::testing::internal::GetCapturedStderr();
  EXPECT_NE(what.find(path), std::string::npos) << what;
  EXPECT_NE(what.find("open"), std::string::npos) << what;
  EXPECT_EQ(printed, "");
}

TEST_F(H5, CreatingADatasetTwiceNamesTheObjectAndTheFile) {
  const std::string path = (dir_ / "twice.h5").string();
  h5::File file = h5::File::create(path);
  const h5::Group g = file.create_group("g");
  g.write("d", std::vector<double>{1, 2});
  const std::string what = message_of([&] { g.write("d", std::vector<double>{3}); });
  EXPECT_NE(what.find("'/g/d'"), std::string::npos) << what;
  EXPECT_NE(what.find(path), std::string::npos) << what;
}

TEST_F(H5, ClosingAFileWithOpenObjectsThrows) {
  const std::string path = (dir_ / "open_objects.h5").string();
  h5::File file = h5::File::create(path);
  const h5::Group g = file.create_group("g");
  EXPECT_NE(message_of([&] { file.close(); }).find(path), std::string::npos);
}

TEST(H5Chunks, ChunkStaysUnderTargetAndKeepsWholeRows) {
  const h5::Shape shape{10, 100, 200, 300};
  const h5::Shape chunk = h5::chunk_for(shape, sizeof(double), std::size_t{1} << 20);
  ASSERT_EQ(chunk.size(), 4u);
  const hsize_t elements = std::accumulate(chunk.begin(), chunk.end(), hsize_t{1}, std::multiplies<>());
  EXPECT_LE(elements * sizeof(double), std::size_t{1} << 20);
  EXPECT_EQ(chunk[0], 1u);    // one frequency per chunk
  EXPECT_EQ(chunk[3], 300u);  // whole x-rows
  EXPECT_EQ(h5::chunk_for({2, 3}, sizeof(double)), (h5::Shape{2, 3}));  // small: one chunk
  EXPECT_TRUE(h5::chunk_for({0, 3}, sizeof(double)).empty());           // zero extent: contiguous
}

TEST_F(H5, SlabsAndComplexPartsLandInPlace) {
  const std::string path = (dir_ / "slabs.h5").string();
  {
    h5::File file = h5::File::create(path);
    {
      const h5::ComplexDataset c = file.create_complex("c", {2, 3}, h5::Storage{.chunk = {}, .deflate_level = 4, .shuffle = true});
      const std::vector<std::complex<double>> second{{4, -4}, {5, -5}, {6, -6}};
      const std::vector<std::complex<double>> first{{1, -1}, {2, -2}, {3, -3}};
      c.write_slab(1, second);  // out of order on purpose
      c.write_slab(0, first);
      EXPECT_THROW(c.write_slab(2, first), std::invalid_argument);
      EXPECT_THROW(c.write_slab(0, std::vector<std::complex<double>>(2)), std::invalid_argument);
    }
    file.close();
  }
  hid_t f = H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT);
  ASSERT_GE(f, 0);
  for (const auto& [name, sign] : {std::pair{"/c_re", 1.0}, {"/c_im", -1.0}}) {
    hid_t d = H5Dopen2(f, name, H5P_DEFAULT);
    std::vector<double> values(6);
    H5Dread(d, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data());
    EXPECT_EQ(values, (std::vector<double>{sign * 1, sign * 2, sign * 3, sign * 4, sign * 5, sign * 6})) << name;
    H5Dclose(d);
  }
  H5Fclose(f);
}

}  // namespace

TEST_F(H5, WhatIsWrittenReadsBackAsVectorsAndStringLists) {
  const std::string path = (dir_ / "back.h5").string();
  {
    h5::File f = h5::File::create(path);
    {
      const h5::Group g = f.create_group("a").create_group("b");
      g.write("numbers", std::vector<std::int64_t>{3, -1, 7});
      g.write("grid", std::vector<double>{1, 2, 3, 4, 5, 6}, h5::Shape{2, 3});
      g.write_strings("names", {"x", "longer name", ""});
      g.write_string("text", "one line\nand another");
      g.set_attribute("components", std::vector<std::string>{"Ex", "Hy"});
      g.set_attribute("kind", "field_map");
    }
    f.close();
  }
  const h5::File f = h5::File::open(path);
  EXPECT_TRUE(f.exists("a/b/numbers"));
  EXPECT_FALSE(f.exists("a/c/numbers")) << "a missing middle link answers false, not an exception";
  EXPECT_FALSE(f.exists("a/b/none"));
  EXPECT_EQ(f.open_dataset("a/b/numbers").read_vector<std::int64_t>(), (std::vector<std::int64_t>{3, -1, 7}));
  EXPECT_EQ(f.open_dataset("a/b/grid").read_vector<double>(), (std::vector<double>{1, 2, 3, 4, 5, 6}));
  EXPECT_EQ(f.open_dataset("a/b/names").read_strings(), (std::vector<std::string>{"x", "longer name", ""}));
  EXPECT_EQ(f.open_dataset("a/b/text").read_strings(), (std::vector<std::string>{"one line\nand another"}));
  EXPECT_EQ(f.open_dataset("a/b/text").read_string(), "one line\nand another");
  const h5::Group b = f.open_group("a/b");
  EXPECT_EQ(b.members(), (std::vector<std::string>{"grid", "names", "numbers", "text"})) << "name order";
  EXPECT_EQ(b.string_attributes("components"), (std::vector<std::string>{"Ex", "Hy"}));
  EXPECT_EQ(b.string_attributes("kind"), (std::vector<std::string>{"field_map"})) << "a scalar is a list of one";
  const std::string e = message_of([&] { (void)f.open_dataset("a/b/numbers").read_strings(); });
  EXPECT_NE(e.find("'/a/b/numbers'"), std::string::npos) << e;
  EXPECT_NE(e.find("not a list of fixed-length strings"), std::string::npos) << e;
}
