// SPDX-License-Identifier: Apache-2.0
// The one "did you mean" of every reader: distance, threshold, wording.
#include <quantacal/common/text.h>

#include <gtest/gtest.h>

namespace {

using quantacal::did_you_mean;
using quantacal::edit_distance;
using quantacal::markup_escape;
using quantacal::nearest_word;

// Levenshtein distances of textbook pairs (Levenshtein 1966 definition; the
// kitten/sitting and flaw/lawn pairs are the usual worked examples, common practice).
TEST(EditDistance, TextbookPairs) {
  EXPECT_EQ(edit_distance("kitten", "sitting"), 3u);
  EXPECT_EQ(edit_distance("flaw", "lawn"), 2u);
  EXPECT_EQ(edit_distance("", "abc"), 3u);
  EXPECT_EQ(edit_distance("abc", ""), 3u);
  EXPECT_EQ(edit_distance("same", "same"), 0u);
  EXPECT_EQ(edit_distance("ab", "ba"), 2u); // no transpositions
}

// The threshold documented in text.h: 1 edit up to 3 characters, 2 for 4 and 5,
// 3 up to 11, then n / 3.
TEST(NearestWord, ThresholdGrowsWithTheWord) {
  EXPECT_EQ(nearest_word("tol", {"toll"}), "toll");     // 1 edit, n = 3
  EXPECT_EQ(nearest_word("tl", {"toll"}), "");          // 2 edits, n = 2
  EXPECT_EQ(nearest_word("rnage", {"range"}), "range"); // 2 edits, n = 5
  EXPECT_EQ(nearest_word("frist_step", {"first_step", "end"}), "first_step");
  EXPECT_EQ(nearest_word("xyz_abc", {"first_step"}), "");
  const std::string long_word = "reference_temprature_x"; // n = 22: 7 edits allowed
  EXPECT_EQ(nearest_word(long_word, {"reference_temperature"}), "reference_temperature");
}

TEST(NearestWord, LetterCaseAloneAlwaysMatches) {
  EXPECT_EQ(nearest_word("THETA_D", {"theta_E", "theta_D"}), "theta_D");
}

TEST(DidYouMean, WordingAndPrefix) {
  EXPECT_EQ(did_you_mean("degre", {"degree", "output"}, "--"),
            " (did you mean '--degree'?)");
  EXPECT_EQ(did_you_mean("zzzz", {"degree"}), "");
}

TEST(MarkupEscape, TheFiveCharactersOfXmlAndHtml) {
  // W3C XML 1.0, sec. 2.4 and 4.6: & and < must be escaped in text, quotes in
  // attribute values; a numeric reference is read by XML and HTML alike.
  EXPECT_EQ(markup_escape(R"(a<b & "c" > 'd')"),
            "a&lt;b &amp; &quot;c&quot; &gt; &#39;d&#39;");
  EXPECT_EQ(markup_escape("Cp, 10-300 K"), "Cp, 10-300 K");
  EXPECT_EQ(markup_escape("&amp;"), "&amp;amp;"); // escaped again, not skipped
  EXPECT_EQ(markup_escape(""), "");
}

} // namespace
