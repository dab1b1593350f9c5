// headless.hpp: an OpenGL 3.3 core context with no display and no window: EGL on Mesa's
// surfaceless platform (EGL_MESA_platform_surfaceless), software-rendered by llvmpipe
// when there is no GPU. Used by `attiscope render` and the render tests.
#pragma once

#include <memory>
#include <string>

#include "attiscope/core/expected.hpp"

namespace attiscope::render {

class HeadlessContext {
 public:
  /// Creates the context and makes it current on this thread. Error with the EGL step that
  /// failed (no EGL, no surfaceless platform, no OpenGL 3.3 core).
  static Expected<std::shared_ptr<HeadlessContext>> create();
  ~HeadlessContext();
  HeadlessContext(const HeadlessContext&) = delete;
  HeadlessContext& operator=(const HeadlessContext&) = delete;

  /// "Mesa ... llvmpipe ..." : GL_RENDERER of the context.
  std::string renderer_name() const;

 private:
  HeadlessContext() = default;
  struct State;
  std::unique_ptr<State> state_;
};

}  // namespace attiscope::render
