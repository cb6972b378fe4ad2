#pragma once
// Writes a run's outputs into a fresh folder under the build tree and opens its results.gpkg
// read-only, for the end-to-end tests that inspect the layers.
#include <gdal_priv.h>

#include <filesystem>
#include <string>

#include "rimline/report/outputs.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"

namespace rimline::test {

inline GDALDatasetUniquePtr write_and_open_results(const run::CheckRun& r, const std::string& folder) {
  const std::filesystem::path out = std::filesystem::path(binary_dir) / folder;
  std::filesystem::remove_all(out);
  report::write_outputs(r, out.string());
  GDALAllRegister();
  return GDALDatasetUniquePtr(
      GDALDataset::Open((out / "results.gpkg").string().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY));
}

}  // namespace rimline::test
