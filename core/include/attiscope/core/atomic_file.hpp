// atomic_file.hpp: writing a file so that a failure never loses the old one.
//
// The text goes to a temporary file in the same folder (so the rename stays on one file
// system), is flushed to disk, and only then renamed over the target. rename(2) replaces
// the target atomically on POSIX: a reader sees the whole old file or the whole new one.
#pragma once

#include <functional>
#include <ostream>
#include <string>
#include <string_view>

#include "attiscope/core/expected.hpp"

namespace attiscope {

/// Called after the temporary file is complete and before the rename, with its path.
/// Returning false abandons the save (the temporary file is removed, the target is left
/// as it was): the hook lets a test simulate a crash between write and rename.
using BeforeRenameHook = std::function<bool(const std::string& temp_path)>;

/// Writes `content` to `path` atomically. Errors (a read-only folder, a full disk, a
/// failed rename) leave the old file untouched and remove the temporary file.
Expected<bool> write_file_atomically(const std::string& path, std::string_view content,
                                     const BeforeRenameHook& before_rename = {});

/// Streams a file's content into `out` (the temporary file, buffered). An error abandons
/// the save.
using StreamFiller = std::function<Expected<bool>(std::ostream& out)>;

/// Writes what `fill` streams to `path` atomically without holding the content in memory:
/// the same temporary file, flush and rename as write_file_atomically (which calls this).
/// An error from `fill` is returned as it is; it, a failed write or a failed rename leaves
/// the old file untouched and removes the temporary file.
Expected<bool> write_file_atomically_streamed(const std::string& path, const StreamFiller& fill,
                                              const BeforeRenameHook& before_rename = {});

/// Reads a whole file. Error when it cannot be opened.
Expected<std::string> read_whole_file(const std::string& path);

}  // namespace attiscope
