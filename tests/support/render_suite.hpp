// render_suite.hpp: one headless EGL context and scene renderer per test suite (creating them
// costs about 40 ms), for render_tests. A suite derives from test::RenderSuite and uses
// context_ and renderer_.
#pragma once

#include <gtest/gtest.h>

#include <memory>

#include "attiscope/render/headless.hpp"
#include "attiscope/render/scene_renderer.hpp"

namespace attiscope::test {

class RenderSuite : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    auto ctx = render::HeadlessContext::create();
    ASSERT_TRUE(ctx.ok()) << ctx.error().describe();
    context_ = ctx.value();
    auto r = render::SceneRenderer::create();
    ASSERT_TRUE(r.ok()) << r.error().describe();
    renderer_ = std::move(r.value()).release();
  }
  static void TearDownTestSuite() {
    delete renderer_;
    renderer_ = nullptr;
    context_.reset();
  }
  static inline std::shared_ptr<render::HeadlessContext> context_;
  static inline render::SceneRenderer* renderer_ = nullptr;
};

}  // namespace attiscope::test
