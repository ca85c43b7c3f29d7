// Unit-test support: the text of the error a call throws, so that a test pins an error message
// in one EXPECT_EQ. Input: a callable and the error type it should throw; output: the error's
// what() (or message()), or "no error" when the call throws none.
#pragma once

#include <string>
#include <utility>

#include "wirefield/model.hpp"

namespace wirefield::testing {

// The whole text of an error: what(), FILE:LINE:COLUMN: error: MESSAGE for an InputError.
template <typename Error>
std::string WhatOf(const Error& error) {
  return error.what();
}

// The bare message of an InputError: message(), without its FILE:LINE:COLUMN.
inline std::string MessageOf(const InputError& error) { return error.message(); }

// `text_of` the `Error` that `action` throws, or "no error" when it throws none. Any other
// exception propagates and fails the test.
template <typename Error = InputError, typename Action>
std::string ErrorText(Action&& action, std::string (*text_of)(const Error&) = &WhatOf<Error>) {
  try {
    std::forward<Action>(action)();
  } catch (const Error& error) {
    return text_of(error);
  }
  return "no error";
}

}  // namespace wirefield::testing
