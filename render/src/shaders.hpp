// shaders.hpp (internal): GLSL 3.30 core sources of the scene renderer.
#pragma once

#include <string>

namespace attiscope::render::detail {

// Lit meshes: a key light from the viewer's upper left, a weak fill from the right, a
// hemisphere ambient around world up, a small specular, and a rim glow for highlights.
// The diffuse, ambient and glow terms are worked out per vertex (our models are flat faces
// and smooth tubes, where that equals the per-pixel result across a face); only the
// specular stays per pixel, with the view direction of the camera's axis (u_half is the
// key light's half vector with it) and the power by squaring. On a software rasteriser every
// instruction of the fragment shader runs for every covered pixel while the vertex shader
// runs a few thousand times a frame.
//
// The shading both the meshes and their edge strips (kEdgeVertex) use, after the version
// line (with_shading).
inline const char* kShadeFunctions = R"(
uniform vec3 u_up;
uniform vec3 u_key;
uniform vec3 u_fill;
uniform vec3 u_half;
// The lit colour of `base` with normal n (towards the viewer) and view direction v, and a
// highlight's glow (rgb, amount).
vec3 shade(vec3 base, vec3 n, vec3 v, vec4 glow) {
  float hemi = 0.5 + 0.5 * dot(n, u_up);
  vec3 ambient = mix(vec3(0.34, 0.34, 0.37), vec3(0.52, 0.52, 0.54), hemi);
  float key = max(dot(n, u_key), 0.0);
  float fill = max(dot(n, u_fill), 0.0);
  vec3 c = base * (ambient + 0.60 * key + 0.20 * fill);
  float rim = pow(1.0 - max(dot(n, v), 0.0), 2.0);
  return mix(c, glow.rgb, glow.a * (0.35 + 0.65 * rim));
}
// The key light's highlight at a pixel of (interpolated) normal n.
float highlight(vec3 n) {
  float s = max(dot(normalize(n), u_half), 0.0);
  s *= s;  // s^2
  s *= s;  // s^4
  float s8 = s * s;
  s = s8 * s8;  // s^16
  return s * s * s8;  // s^40
}
)";

/// A shader source: the version line, kShadeFunctions, then `body`.
inline std::string with_shading(const char* body) {
  return std::string("#version 330 core\n") + kShadeFunctions + body;
}

inline const char* kMeshVertex = R"(
layout(location = 0) in vec3 a_pos;
layout(location = 1) in vec3 a_normal;
layout(location = 2) in vec4 a_color;
uniform mat4 u_model;
uniform mat3 u_normal_matrix;
uniform mat4 u_view_proj;
uniform vec3 u_eye;
uniform vec4 u_tint;        // rgb, and how much it replaces the vertex colour
uniform vec4 u_glow;        // rgb, amount
out vec3 v_color;
out vec3 v_normal;
void main() {
  vec4 w = u_model * vec4(a_pos, 1.0);
  vec3 n = normalize(u_normal_matrix * a_normal);
  vec3 v = normalize(u_eye - w.xyz);
  if (dot(n, v) < 0.0) n = -n;  // two-sided: thin parts and open shells
  v_color = shade(mix(a_color.rgb, u_tint.rgb, u_tint.a), n, v, u_glow);
  v_normal = n;
  gl_Position = u_view_proj * w;
}
)";

inline const char* kMeshFragment = R"(
in vec3 v_color;
in vec3 v_normal;
uniform float u_alpha;
uniform float u_spec;       // muted under a highlight's glow
out vec4 o_color;
void main() {
  o_color = vec4(v_color + vec3(u_spec * highlight(v_normal)), u_alpha);
}
)";

// Edge strips (edge_strips.hpp): one-pixel lines placed on the CPU in normalised device
// coordinates, shaded like the mesh they belong to (one colour a line: flat values cost a
// line's setup much less than interpolated ones), blended with the coverage falling from
// the edge outwards.
inline const char* kEdgeVertex = R"(
layout(location = 0) in vec3 a_ndc;
layout(location = 1) in vec3 a_world;
layout(location = 2) in vec3 a_normal;
layout(location = 3) in vec4 a_color;   // rgb, the mesh's alpha
layout(location = 4) in vec4 a_glow;
layout(location = 5) in vec3 a_edge;   // window pixels: outward normal, offset
uniform vec3 u_eye;
uniform float u_specular;               // the highlight's strength without a glow
flat out vec4 v_color;
flat out vec3 v_edge;
void main() {
  vec3 n = normalize(a_normal);
  vec3 v = normalize(u_eye - a_world);
  if (dot(n, v) < 0.0) n = -n;
  float spec = u_specular * (1.0 - 0.5 * a_glow.a) * highlight(n);
  v_color = vec4(shade(a_color.rgb, n, v, a_glow) + vec3(spec), a_color.a);
  v_edge = a_edge;
  gl_Position = vec4(a_ndc, 1.0);
}
)";

inline const char* kEdgeFragment = R"(
flat in vec4 v_color;
flat in vec3 v_edge;
out vec4 o_color;
void main() {
  float out_px = dot(v_edge.xy, gl_FragCoord.xy) - v_edge.z;
  o_color = vec4(v_color.rgb, v_color.a * clamp(1.0 - out_px, 0.0, 1.0));
}
)";

// Rectangles given in pixels (GL's bottom-left origin): the smoothing pass's tiles.
inline const char* kTileVertex = R"(#version 330 core
layout(location = 0) in vec2 a_pixel;
uniform vec2 u_size;
void main() {
  gl_Position = vec4(a_pixel / u_size * 2.0 - 1.0, 0.0, 1.0);
}
)";

// The ground grid: line segments in ground coordinates, each drawn as a thin screen-space
// strip (expanded in the vertex shader) whose edge falloff antialiases it analytically.
// Only the pixels of the lines are shaded, which is what a software rasteriser needs.
inline const char* kGridVertex = R"(#version 330 core
layout(location = 0) in vec2 a_uv;        // this end, ground coordinates
layout(location = 1) in vec2 a_other;     // the other end
layout(location = 2) in vec3 a_style;     // side (-1 or 1), half width in pixels, alpha
layout(location = 3) in float a_kind;     // 0 grid, 1 world x axis, 2 world y axis
uniform vec3 u_origin;
uniform vec3 u_e1;
uniform vec3 u_e2;
uniform mat4 u_view_proj;
uniform vec2 u_viewport;
uniform float u_extent;
uniform vec3 u_color;
uniform vec3 u_x_color;
uniform vec3 u_y_color;
uniform float u_foot;     // the world triad's foot, at (u_foot, u_foot)
uniform float u_y_flip;   // 1 when world +y runs along -e2 (NED): mirror the y axis line
out float v_dist;     // signed distance from the line's centre, pixels
out float v_half;
out vec4 v_color;
const float kNearW = 0.05;
void main() {
  vec2 uv = a_uv, other = a_other;
  if (a_kind > 1.5 && u_y_flip > 0.5) {
    uv.y = 2.0 * u_foot - uv.y;
    other.y = 2.0 * u_foot - other.y;
  }
  vec4 c0 = u_view_proj * vec4(u_origin + uv.x * u_e1 + uv.y * u_e2, 1.0);
  vec4 c1 = u_view_proj * vec4(u_origin + other.x * u_e1 + other.y * u_e2, 1.0);
  // Clip the segment against a plane just in front of the eye.
  if (c0.w < kNearW && c1.w >= kNearW) c0 = mix(c0, c1, (kNearW - c0.w) / (c1.w - c0.w));
  if (c1.w < kNearW && c0.w >= kNearW) c1 = mix(c1, c0, (kNearW - c1.w) / (c0.w - c1.w));
  vec2 s0 = c0.xy / max(c0.w, kNearW) * 0.5 * u_viewport;
  vec2 s1 = c1.xy / max(c1.w, kNearW) * 0.5 * u_viewport;
  vec2 d = s1 - s0;
  d = length(d) > 1e-6 ? normalize(d) : vec2(1.0, 0.0);
  float half_w = a_style.y;
  float reach = half_w + 0.5;  // where the fragment shader's coverage reaches 0
  vec2 offset = vec2(-d.y, d.x) * a_style.x * reach;
  gl_Position = c0 + vec4(offset / (0.5 * u_viewport) * c0.w, 0.0, 0.0);
  if (c0.w < kNearW) gl_Position = vec4(2.0, 2.0, 2.0, 1.0);  // both ends behind the eye
  // The offset's side is relative to this end's own direction, which is reversed at the far
  // end; the distance is measured to one side of the segment (from its lexicographically
  // smaller end), so it interpolates across the strip the same way from both ends.
  bool from_first = a_uv.x < a_other.x || (a_uv.x == a_other.x && a_uv.y < a_other.y);
  v_dist = a_style.x * reach * (from_first ? 1.0 : -1.0);
  v_half = half_w;
  float fade = 1.0 - smoothstep(0.45 * u_extent, u_extent, length(uv));
  vec3 col = a_kind < 0.5 ? u_color : (a_kind < 1.5 ? u_x_color : u_y_color);
  v_color = vec4(col, a_style.z * fade);
}
)";

inline const char* kGridFragment = R"(#version 330 core
in float v_dist;
in float v_half;
in vec4 v_color;
out vec4 o_color;
void main() {
  float coverage = clamp(v_half + 0.5 - abs(v_dist), 0.0, 1.0);
  o_color = vec4(v_color.rgb, v_color.a * coverage);
}
)";

// Edge-aware smoothing after Lottes 2009 ("FXAA", NVIDIA white paper), run on the tiles
// around the meshes only (smooth_tiles.hpp). A pixel is an edge when the luma range of it and
// its four diagonal neighbours is at least kFlat and a mesh covers one of them (alpha is the
// meshes' cover: 1; 254 / 255 on the background and the grid, which are smooth already);
// an edge pixel blends two taps along the local edge direction found from the diagonals
// (the paper's narrow blend; its wider four-tap blend doubled the pass's cost for a barely
// visible gain on our flat-shaded models), any other keeps its colour. One pass: llvmpipe
// runs both sides of a branch, and an earlier pass that only marked the edges in the
// stencil, so that a second pass could blend under an early stencil test, cost as much as
// the blend itself.
inline const char* kSmoothFragment = R"(#version 330 core
uniform sampler2D u_scene;
uniform vec2 u_texel;    // 1 / size
out vec4 o_color;
const vec3 kLuma = vec3(0.299, 0.587, 0.114);
const float kFlat = 1.0 / 24.0;  // luma range below which nothing is smoothed
const float kMeshCover = 0.998;  // between the uncovered alpha (254 / 255) and 1
const float kReduceMin = 1.0 / 128.0;
const float kReduceMul = 1.0 / 8.0;
const float kSpanMax = 8.0;
void main() {
  // Unfiltered fetches at texel centres (cheap on a software rasteriser).
  ivec2 p = ivec2(gl_FragCoord.xy);
  ivec2 hi = textureSize(u_scene, 0) - 1;
  vec4 m = texelFetch(u_scene, p, 0);
  vec4 nw = texelFetch(u_scene, clamp(p + ivec2(-1, -1), ivec2(0), hi), 0);
  vec4 ne = texelFetch(u_scene, clamp(p + ivec2(1, -1), ivec2(0), hi), 0);
  vec4 sw = texelFetch(u_scene, clamp(p + ivec2(-1, 1), ivec2(0), hi), 0);
  vec4 se = texelFetch(u_scene, clamp(p + ivec2(1, 1), ivec2(0), hi), 0);
  float lm = dot(m.rgb, kLuma), lnw = dot(nw.rgb, kLuma), lne = dot(ne.rgb, kLuma);
  float lsw = dot(sw.rgb, kLuma), lse = dot(se.rgb, kLuma);
  float lmin = min(lm, min(min(lnw, lne), min(lsw, lse)));
  float lmax = max(lm, max(max(lnw, lne), max(lsw, lse)));
  float cover = max(m.a, max(max(nw.a, ne.a), max(sw.a, se.a)));
  vec2 uv = (vec2(p) + 0.5) * u_texel;
  vec2 dir = vec2(-((lnw + lne) - (lsw + lse)), (lnw + lsw) - (lne + lse));
  float reduce = max((lnw + lne + lsw + lse) * 0.25 * kReduceMul, kReduceMin);
  float rcp_min = 1.0 / (min(abs(dir.x), abs(dir.y)) + reduce);
  dir = clamp(dir * rcp_min, vec2(-kSpanMax), vec2(kSpanMax)) * u_texel;
  vec3 a = 0.5 * (texture(u_scene, uv + dir * (1.0 / 3.0 - 0.5)).rgb + texture(u_scene, uv + dir * (2.0 / 3.0 - 0.5)).rgb);
  bool edge = lmax - lmin >= kFlat && cover >= kMeshCover;
  o_color = edge ? vec4(a, 1.0) : m;
}
)";

// Labels: glyph quads in pixels, with a light halo so they read over any background.
inline const char* kTextVertex = R"(#version 330 core
layout(location = 0) in vec2 a_pos;   // pixels, top-left origin of the region
layout(location = 1) in vec2 a_uv;
layout(location = 2) in vec4 a_color;
uniform vec2 u_size;
out vec2 v_uv;
out vec4 v_color;
void main() {
  v_uv = a_uv;
  v_color = a_color;
  gl_Position = vec4(a_pos.x / u_size.x * 2.0 - 1.0, 1.0 - a_pos.y / u_size.y * 2.0, 0.0, 1.0);
}
)";

inline const char* kTextFragment = R"(#version 330 core
in vec2 v_uv;
in vec4 v_color;
uniform sampler2D u_atlas;
uniform vec2 u_texel;
uniform vec3 u_halo;
out vec4 o_color;
void main() {
  float a = texture(u_atlas, v_uv).r;
  float h = 0.0;
  for (int i = 0; i < 8; ++i) {
    float t = float(i) * 0.785398;
    h = max(h, texture(u_atlas, v_uv + vec2(cos(t), sin(t)) * u_texel * 2.2).r);
  }
  float alpha = max(a, h * 0.85);
  if (alpha < 0.01) discard;
  o_color = vec4(mix(u_halo, v_color.rgb, a / max(alpha, 1e-3)), alpha * v_color.a);
}
)";

}  // namespace attiscope::render::detail
