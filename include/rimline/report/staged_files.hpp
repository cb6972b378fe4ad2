#pragma once
// An output set replaced as a whole or not at all. Every file is written into a new sibling folder
// of the output folder (".NAME.staging-PID"); commit() carries the entries of the old folder that
// are not outputs over (hard links: the user's own files stay as they are), then swaps the staged
// folder into place with one rename (Linux renameat2 RENAME_EXCHANGE) and removes the old outputs.
// A run that fails or is stopped before that rename leaves the folder exactly as it was; one that
// fails after it has the whole new set. Errors say which state the folder was left in.
#include <functional>
#include <iosfwd>
#include <string>
#include <vector>

namespace rimline::report {

class StagedFiles {
 public:
  // `outputs`: the names in out_dir that belong to the output set besides those staged (files or
  // folders), replaced even when this run does not write them. Makes the staging folder and
  // removes the staging folders of killed earlier runs; throws rimline::Error (bad_config) when
  // out_dir is not a folder or the staging folder cannot be made.
  explicit StagedFiles(std::string out_dir, std::vector<std::string> outputs = {});
  ~StagedFiles();  // removes the staging folder when not committed
  StagedFiles(const StagedFiles&) = delete;
  StagedFiles& operator=(const StagedFiles&) = delete;

  // Where to write `name` (a relative path such as "profiles/x.svg"); its folder is made.
  std::string path_for(const std::string& name);
  void write_text(const std::string& name, const std::string& text);
  // Streams a file's content as it is made (a city's exceptions.csv is ~150 MB: not held in memory).
  void write_stream(const std::string& name, const std::function<void(std::ostream&)>& fill);
  // Puts the staged set in place of the output folder's (see the top of this file).
  void commit();

  const std::string& out_dir() const { return out_; }
  const std::string& staging_dir() const { return staging_; }
  // The output name a staged path stands for ("out/results.gpkg" for ".../.out.staging-7/results.gpkg"), for messages.
  std::string final_name(const std::string& staged_path) const;
  // What a failure before the swap leaves: appended to every error message of the writers.
  static constexpr const char* untouched = "the output folder was left as it was (nothing in it changed)";

 private:
  bool owned(const std::string& name) const;
  void carry_over_others() const;

  std::string out_;      // the output folder, absolute, symbolic links resolved
  std::string staging_;  // the sibling folder the set is written into
  std::vector<std::string> outputs_;
  bool committed_ = false;
};

// Throws Error(bad_config) when one of `inputs` is (same device and inode, however it is named) a
// file the output set in out_dir would replace: a layer read from an earlier run's results.gpkg
// with --out that same folder. Inputs elsewhere in out_dir are carried over untouched.
void refuse_outputs_over_inputs(const std::string& out_dir, const std::vector<std::string>& output_names,
                                const std::vector<std::string>& inputs);

}  // namespace rimline::report
