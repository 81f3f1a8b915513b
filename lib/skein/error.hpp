#pragma once
// The project's error policy, written down once:
//  - Bad input (a design file, a flag, a value out of its domain) throws skein::InputError. Its message
//    says what was wrong, where (file:line:column or the YAML path), and what would be right.
//  - Internal invariants are checked with assert(); a failed assert is a bug in skein, not in the input.
//  - The CLI catches InputError (and std::exception) at the top, prints "skein: error: ..." on stderr and
//    exits with status 2 (bad input) or 3 (an unexpected failure). Nothing is written on error.
#include <stdexcept>
#include <string>

namespace skein {

class InputError : public std::runtime_error {
 public:
  explicit InputError(const std::string& message) : std::runtime_error(message) {}
};

}  // namespace skein
