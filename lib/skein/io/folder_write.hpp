#pragma once
// Writing a folder of files as one unit: everything goes into a hidden sibling folder first, each file
// through write_file_atomic, and only then is the folder put in place by rename. An interrupted run leaves
// the previous folder (or none) and at most a hidden ".NAME.tmp-*" folder, never a half-written report.
#include <string>
#include <vector>

namespace skein {

struct OutputFile {
  std::string relative_path;  // "plots/coverage_map.svg"
  std::string content;
};

// Replace folder `dir` by one holding exactly `files`, creating missing parent folders. Throws InputError
// when the parent folder cannot be created or written, or when `dir` exists and is not a folder.
void write_folder_atomic(const std::string& dir, const std::vector<OutputFile>& files);

}  // namespace skein
