#pragma once
// Writes files under temporary names in the output directory and renames them into place
// only when all are complete (rename is atomic within one file system).
#include <functional>
#include <iosfwd>
#include <string>
#include <vector>

namespace rimline::report {

class StagedFiles {
 public:
  // Creates out_dir if needed and removes the temporaries of killed earlier runs; throws rimline::Error.
  explicit StagedFiles(std::string out_dir);
  ~StagedFiles();                              // removes temporaries not committed
  StagedFiles(const StagedFiles&) = delete;
  StagedFiles& operator=(const StagedFiles&) = delete;

  // Temporary path to write `name` to.
  std::string path_for(const std::string& name);
  void write_text(const std::string& name, const std::string& text);
  // Streams a file's content as it is made (a city's exceptions.csv is ~150 MB: not held in memory).
  void write_stream(const std::string& name, const std::function<void(std::ostream&)>& fill);
  // Renames every staged file to its final name.
  void commit();

 private:
  void remove_leftovers();

  std::string dir_;
  std::vector<std::pair<std::string, std::string>> staged_;  // temp, final
  bool committed_ = false;
};

}  // namespace rimline::report
