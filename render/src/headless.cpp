// headless.cpp: an EGL context on Mesa's surfaceless platform, no display needed.
#include "attiscope/render/headless.hpp"

#include <EGL/egl.h>
#include <EGL/eglext.h>

#include "gl.hpp"

namespace attiscope::render {

struct HeadlessContext::State {
  EGLDisplay display = EGL_NO_DISPLAY;
  EGLContext context = EGL_NO_CONTEXT;
};

namespace {
std::string egl_error(const char* step) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "0x%04x", static_cast<unsigned>(eglGetError()));
  return std::string("headless OpenGL: ") + step + " failed (EGL error " + buf + ")";
}
}  // namespace

Expected<std::shared_ptr<HeadlessContext>> HeadlessContext::create() {
  std::shared_ptr<HeadlessContext> ctx(new HeadlessContext());
  ctx->state_ = std::make_unique<State>();
  State& s = *ctx->state_;
  // EGL_MESA_platform_surfaceless: a display with no window system behind it.
  auto get_platform_display =
      reinterpret_cast<PFNEGLGETPLATFORMDISPLAYEXTPROC>(eglGetProcAddress("eglGetPlatformDisplayEXT"));
  if (get_platform_display) {
    s.display = get_platform_display(EGL_PLATFORM_SURFACELESS_MESA, EGL_DEFAULT_DISPLAY, nullptr);
  }
  if (s.display == EGL_NO_DISPLAY) s.display = eglGetDisplay(EGL_DEFAULT_DISPLAY);
  if (s.display == EGL_NO_DISPLAY) return Error(egl_error("eglGetPlatformDisplay (surfaceless)"));
  EGLint major = 0, minor = 0;
  if (!eglInitialize(s.display, &major, &minor)) return Error(egl_error("eglInitialize"));
  if (!eglBindAPI(EGL_OPENGL_API)) return Error(egl_error("eglBindAPI(OpenGL)"));
  const EGLint context_attribs[] = {EGL_CONTEXT_MAJOR_VERSION,
                                    3,
                                    EGL_CONTEXT_MINOR_VERSION,
                                    3,
                                    EGL_CONTEXT_OPENGL_PROFILE_MASK,
                                    EGL_CONTEXT_OPENGL_CORE_PROFILE_BIT,
                                    EGL_NONE};
  // EGL_KHR_no_config_context + EGL_KHR_surfaceless_context: no config, no surface; we
  // draw into our own framebuffer objects.
  s.context = eglCreateContext(s.display, EGL_NO_CONFIG_KHR, EGL_NO_CONTEXT, context_attribs);
  if (s.context == EGL_NO_CONTEXT) return Error(egl_error("eglCreateContext (OpenGL 3.3 core)"));
  if (!eglMakeCurrent(s.display, EGL_NO_SURFACE, EGL_NO_SURFACE, s.context)) {
    return Error(egl_error("eglMakeCurrent (surfaceless)"));
  }
  return ctx;
}

HeadlessContext::~HeadlessContext() {
  if (!state_) return;
  if (state_->display != EGL_NO_DISPLAY) {
    eglMakeCurrent(state_->display, EGL_NO_SURFACE, EGL_NO_SURFACE, EGL_NO_CONTEXT);
    if (state_->context != EGL_NO_CONTEXT) eglDestroyContext(state_->display, state_->context);
    eglTerminate(state_->display);
  }
}

std::string HeadlessContext::renderer_name() const {
  const auto* name = reinterpret_cast<const char*>(glGetString(GL_RENDERER));
  return name ? name : "unknown";
}

}  // namespace attiscope::render
