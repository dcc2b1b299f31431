#include "app/cli/arguments.h"

#include <gtest/gtest.h>

#include "core/util/errors.h"

namespace calivera::cli {
namespace {

const OptionSpec kSpec{{"--data", "--model"}, {"--firth"}};

TEST(Arguments, ReadsValuesFlagsAndRepeats) {
  const Arguments args({"--data", "a.csv", "--model", "m1.json", "--model=m2.json", "--firth"},
                       kSpec);
  EXPECT_EQ(args.required("--data"), "a.csv");
  EXPECT_EQ(args.values("--model"), (std::vector<std::string>{"m1.json", "m2.json"}));
  EXPECT_TRUE(args.has("--firth"));
  EXPECT_FALSE(args.value("--outcome").has_value());
}

TEST(Arguments, RejectsUnknownOptionsAndMissingValues) {
  EXPECT_THROW(Arguments({"--dta", "a.csv"}, kSpec), InputError);
  EXPECT_THROW(Arguments({"--data"}, kSpec), InputError);
  EXPECT_THROW(Arguments({"--firth=yes"}, kSpec), InputError);
  EXPECT_THROW(Arguments({}, kSpec).required("--data"), InputError);
}

TEST(Arguments, ListsAndNumbersAreStrict) {
  EXPECT_EQ(splitList("age,sex", "--predictors"), (std::vector<std::string>{"age", "sex"}));
  EXPECT_THROW(splitList("age,,sex", "--predictors"), InputError);
  EXPECT_DOUBLE_EQ(parseNumber("0.25", "--x"), 0.25);
  EXPECT_THROW(parseNumber("0.25abc", "--x"), InputError);
  EXPECT_THROW(parseNumber("nan", "--x"), InputError);
  EXPECT_EQ(parseInteger("10", "--groups"), 10);
  EXPECT_THROW(parseInteger("1.5", "--groups"), InputError);
}

}  // namespace
}  // namespace calivera::cli
