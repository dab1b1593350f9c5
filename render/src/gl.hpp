// gl.hpp (internal): OpenGL 3.3 core entry points, RAII owners of GL objects, the
// debug-build error check, and shader compilation. GL functions come straight from
// Debian's libOpenGL (GLVND), which dispatches to whatever context is current (the
// window's GLX context or our EGL one), so no loader is needed.
#pragma once

#define GL_GLEXT_PROTOTYPES 1
#include <GL/glcorearb.h>

#include <string>
#include <utility>

#include "attiscope/core/expected.hpp"

namespace attiscope::render::gl {

/// In debug builds, a GL error after `what` stops the program with its name (an internal
/// invariant: our own GL calls are wrong). Release builds skip the check (glGetError
/// synchronises the pipeline).
#ifndef NDEBUG
void check(const char* what);
#else
inline void check(const char*) {}
#endif

/// Owns one GL object name; deletes it with Deleter. Move-only.
template <void (*Delete)(GLuint)>
class Handle {
 public:
  Handle() = default;
  explicit Handle(GLuint id) : id_(id) {}
  ~Handle() { reset(); }
  Handle(Handle&& o) noexcept : id_(std::exchange(o.id_, 0)) {}
  Handle& operator=(Handle&& o) noexcept {
    if (this != &o) {
      reset();
      id_ = std::exchange(o.id_, 0);
    }
    return *this;
  }
  Handle(const Handle&) = delete;
  Handle& operator=(const Handle&) = delete;
  GLuint get() const { return id_; }
  explicit operator bool() const { return id_ != 0; }
  void reset() {
    if (id_) Delete(id_);
    id_ = 0;
  }

 private:
  GLuint id_ = 0;
};

inline void delete_buffer(GLuint id) {
  glDeleteBuffers(1, &id);
}
inline void delete_vertex_array(GLuint id) {
  glDeleteVertexArrays(1, &id);
}
inline void delete_texture(GLuint id) {
  glDeleteTextures(1, &id);
}
inline void delete_framebuffer(GLuint id) {
  glDeleteFramebuffers(1, &id);
}
inline void delete_renderbuffer(GLuint id) {
  glDeleteRenderbuffers(1, &id);
}
inline void delete_program(GLuint id) {
  glDeleteProgram(id);
}

using Buffer = Handle<delete_buffer>;
using VertexArray = Handle<delete_vertex_array>;
using Texture = Handle<delete_texture>;
using Framebuffer = Handle<delete_framebuffer>;
using Renderbuffer = Handle<delete_renderbuffer>;
using Program = Handle<delete_program>;

Buffer make_buffer();
VertexArray make_vertex_array();
Texture make_texture();
Framebuffer make_framebuffer();
Renderbuffer make_renderbuffer();

/// Compiles and links a program; error with the GL info log.
Expected<Program> make_program(const char* name, const std::string& vertex_src,
                               const std::string& fragment_src);

}  // namespace attiscope::render::gl
