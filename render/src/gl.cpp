// gl.cpp: GL object creation, shader compilation and the debug-build error check.
#include "gl.hpp"

#include <cstdio>
#include <cstdlib>
#include <optional>
#include <vector>

namespace attiscope::render::gl {

#ifndef NDEBUG
void check(const char* what) {
  const GLenum e = glGetError();
  if (e != GL_NO_ERROR) {
    std::fprintf(stderr, "attiscope render: OpenGL error 0x%04x after %s\n", e, what);
    std::abort();
  }
}
#endif

Buffer make_buffer() {
  GLuint id = 0;
  glGenBuffers(1, &id);
  return Buffer(id);
}
VertexArray make_vertex_array() {
  GLuint id = 0;
  glGenVertexArrays(1, &id);
  return VertexArray(id);
}
Texture make_texture() {
  GLuint id = 0;
  glGenTextures(1, &id);
  return Texture(id);
}
Framebuffer make_framebuffer() {
  GLuint id = 0;
  glGenFramebuffers(1, &id);
  return Framebuffer(id);
}
Renderbuffer make_renderbuffer() {
  GLuint id = 0;
  glGenRenderbuffers(1, &id);
  return Renderbuffer(id);
}

namespace {
struct Shader {
  GLuint id;
  ~Shader() { glDeleteShader(id); }
};

std::string shader_log(GLuint id) {
  GLint n = 0;
  glGetShaderiv(id, GL_INFO_LOG_LENGTH, &n);
  std::vector<char> log(static_cast<std::size_t>(n > 0 ? n : 1));
  glGetShaderInfoLog(id, n, nullptr, log.data());
  return std::string(log.data());
}
}  // namespace

Expected<Program> make_program(const char* name, const std::string& vertex_src,
                               const std::string& fragment_src) {
  auto compile = [&](GLenum type, const std::string& src, GLuint* out) -> std::optional<Error> {
    *out = glCreateShader(type);
    const char* text = src.c_str();
    glShaderSource(*out, 1, &text, nullptr);
    glCompileShader(*out);
    GLint ok = 0;
    glGetShaderiv(*out, GL_COMPILE_STATUS, &ok);
    if (!ok) {
      return Error(std::string("shader '") + name + "' (" +
                   (type == GL_VERTEX_SHADER ? "vertex" : "fragment") +
                   ") does not compile: " + shader_log(*out));
    }
    return std::nullopt;
  };
  Shader vs{0}, fs{0};
  if (auto e = compile(GL_VERTEX_SHADER, vertex_src, &vs.id)) return *e;
  if (auto e = compile(GL_FRAGMENT_SHADER, fragment_src, &fs.id)) return *e;
  Program p(glCreateProgram());
  glAttachShader(p.get(), vs.id);
  glAttachShader(p.get(), fs.id);
  glLinkProgram(p.get());
  GLint ok = 0;
  glGetProgramiv(p.get(), GL_LINK_STATUS, &ok);
  if (!ok) {
    GLint n = 0;
    glGetProgramiv(p.get(), GL_INFO_LOG_LENGTH, &n);
    std::vector<char> log(static_cast<std::size_t>(n > 0 ? n : 1));
    glGetProgramInfoLog(p.get(), n, nullptr, log.data());
    return Error(std::string("shader '") + name + "' does not link: " + log.data());
  }
  return p;
}

}  // namespace attiscope::render::gl
