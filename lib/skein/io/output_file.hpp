#pragma once
// The check made before any work for a single output file (such as `coverage --points FILE`): skein writes
// over an existing file only when it recognises the file as one it wrote before (its first line starts with
// the signature skein gives that kind of file), when the file is empty, or when the user passes --overwrite;
// and never over an input file, whatever the flags.
#include <string>
#include <string_view>
#include <vector>

namespace skein {

struct OutputFileCheck {
  std::string option;                   // the option naming the file, for messages ("--points")
  std::string signature;                // the start of the first line of such a file as skein writes it
  bool overwrite = false;               // --overwrite
  std::vector<std::string> inputs;      // files the output must not be (nor, for folders, contain)
};

// Throws InputError (with the option, the path and what would be accepted) when `path` is a folder, an
// input file, or an existing non-empty file whose first line does not start with check.signature and
// check.overwrite is not set.
void check_output_file(const std::string& path, const OutputFileCheck& check);

}  // namespace skein
