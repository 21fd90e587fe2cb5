// SPDX-License-Identifier: Apache-2.0
// Helpers of the card tests.
#ifndef QUANTACAL_TESTS_CARDS_SUPPORT_H
#define QUANTACAL_TESTS_CARDS_SUPPORT_H

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <string>

namespace quantacal::test {

inline std::string material_path(const std::string& file) {
  return std::string(QUANTACAL_SOURCE_DIR) + "/materials/" + file;
}

inline std::string data_path(const std::string& file) {
  return std::string(QUANTACAL_SOURCE_DIR) + "/tests/data/" + file;
}

/** Loads @p text and returns the CardError it must raise. */
inline CardError card_error(const std::string& text,
                            const std::string& file = "bad.yaml") {
  try {
    load_card_from_string(text, file);
  } catch (const CardError& e) {
    return e;
  }
  ADD_FAILURE() << "expected a CardError for:\n" << text;
  return CardError("", 0, 0, "", "", "");
}

/** Replaces the first occurrence of @p from in @p text (which must contain it). */
inline std::string replace(std::string text, const std::string& from,
                           const std::string& to) {
  const auto pos = text.find(from);
  EXPECT_NE(pos, std::string::npos) << from;
  if (pos != std::string::npos)
    text.replace(pos, from.size(), to);
  return text;
}

} // namespace quantacal::test

#endif
