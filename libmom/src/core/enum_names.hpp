// Core: the text of an enum's values, read from a table of (value, name) pairs, so that each
// enum spells its values in one place, for printing and parsing alike.
#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <string_view>
#include <utility>

namespace wirefield::core {

// The names of an enum's N values.
template <typename Enum, std::size_t N>
using EnumNames = std::array<std::pair<Enum, const char*>, N>;

// The name of `value` in `names`, or `fallback` for a value the table lacks.
template <typename Enum, std::size_t N>
constexpr const char* NameOf(Enum value, const EnumNames<Enum, N>& names, const char* fallback) {
  for (const auto& [listed, name] : names) {
    if (listed == value) return name;
  }
  return fallback;
}

// The value named `text` in `names`, or none.
template <typename Enum, std::size_t N>
constexpr std::optional<Enum> ValueOf(std::string_view text, const EnumNames<Enum, N>& names) {
  for (const auto& [value, name] : names) {
    if (text == name) return value;
  }
  return std::nullopt;
}

}  // namespace wirefield::core
