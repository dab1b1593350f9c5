// intake_fuzz.cpp: libFuzzer target for the paste reader and the column finder. Any text
// must give readings or an Error, never a crash, a hang or undefined behaviour.
// Build: cmake -S . -B build-fuzz -DCMAKE_CXX_COMPILER=clang++ -DATTISCOPE_FUZZ=ON
// Long run: build-fuzz/tests/fuzz/intake_fuzz -max_total_time=3600 tests/fuzz/intake_seeds
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "attiscope/core/columns.hpp"
#include "attiscope/core/intake.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  auto result = attiscope::read_pasted(text);
  if (result) {
    (void)attiscope::intake_json(result.value()).dump();
  }
  auto mapping = attiscope::find_columns(text);
  if (mapping) (void)attiscope::read_track_text(text, mapping.value());
  return 0;
}
