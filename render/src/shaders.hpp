// shaders.hpp (internal): GLSL 3.30 core sources of the scene renderer.
#pragma once

namespace attiscope::render::detail {

// Lit meshes: a key light from the viewer's upper left, a weak fill from the right, a
// hemisphere ambient around world up, a small specular, and a rim glow for highlights.
inline const char* kMeshVertex = R"(#version 330 core
layout(location = 0) in vec3 a_pos;
layout(location = 1) in vec3 a_normal;
layout(location = 2) in vec4 a_color;
uniform mat4 u_model;
uniform mat3 u_normal_matrix;
uniform mat4 u_view_proj;
out vec3 v_pos;
out vec3 v_normal;
out vec4 v_color;
void main() {
  vec4 w = u_model * vec4(a_pos, 1.0);
  v_pos = w.xyz;
  v_normal = u_normal_matrix * a_normal;
  v_color = a_color;
  gl_Position = u_view_proj * w;
}
)";

inline const char* kMeshFragment = R"(#version 330 core
in vec3 v_pos;
in vec3 v_normal;
in vec4 v_color;
uniform vec3 u_eye;
uniform vec3 u_up;
uniform vec3 u_key;
uniform vec3 u_fill;
uniform vec4 u_tint;        // rgb, and how much it replaces the vertex colour
uniform float u_alpha;
uniform vec4 u_glow;        // rgb, amount
out vec4 o_color;
void main() {
  vec3 n = normalize(v_normal);
  vec3 v = normalize(u_eye - v_pos);
  if (dot(n, v) < 0.0) n = -n;  // two-sided: thin parts and open shells
  vec3 base = mix(v_color.rgb, u_tint.rgb, u_tint.a);
  float hemi = 0.5 + 0.5 * dot(n, u_up);
  vec3 ambient = mix(vec3(0.34, 0.34, 0.37), vec3(0.52, 0.52, 0.54), hemi);
  float key = max(dot(n, u_key), 0.0);
  float fill = max(dot(n, u_fill), 0.0);
  vec3 h = normalize(u_key + v);
  float spec = pow(max(dot(n, h), 0.0), 40.0) * 0.22;
  vec3 c = base * (ambient + 0.60 * key + 0.20 * fill) + vec3(spec);
  float rim = pow(1.0 - max(dot(n, v), 0.0), 2.0);
  c = mix(c, u_glow.rgb, u_glow.a * (0.35 + 0.65 * rim));
  o_color = vec4(c, u_alpha);
}
)";

// A full-screen triangle from gl_VertexID (no vertex buffer).
inline const char* kFullscreenVertex = R"(#version 330 core
out vec2 v_uv;
void main() {
  vec2 p = vec2(float((gl_VertexID << 1) & 2), float(gl_VertexID & 2));
  v_uv = p;
  gl_Position = vec4(p * 2.0 - 1.0, 0.0, 1.0);
}
)";

inline const char* kBackgroundFragment = R"(#version 330 core
in vec2 v_uv;
uniform vec3 u_top;
uniform vec3 u_bottom;
out vec4 o_color;
void main() { o_color = vec4(mix(u_bottom, u_top, clamp(v_uv.y, 0.0, 1.0)), 1.0); }
)";

// The ground grid: one quad; lines drawn analytically with screen-space derivatives, so
// they are antialiased at every distance, fading out toward the edge.
inline const char* kGridVertex = R"(#version 330 core
layout(location = 0) in vec2 a_uv;
uniform vec3 u_origin;
uniform vec3 u_e1;
uniform vec3 u_e2;
uniform mat4 u_view_proj;
out vec2 v_uv;
void main() {
  v_uv = a_uv;
  gl_Position = u_view_proj * vec4(u_origin + a_uv.x * u_e1 + a_uv.y * u_e2, 1.0);
}
)";

inline const char* kGridFragment = R"(#version 330 core
in vec2 v_uv;
uniform vec3 u_color;
uniform vec3 u_x_color;
uniform vec3 u_y_color;
uniform float u_extent;
uniform vec2 u_axis_origin;
out vec4 o_color;
float grid_line(vec2 c, float spacing, float width_px) {
  vec2 d = abs(fract(c / spacing - 0.5) - 0.5) * spacing / max(fwidth(c), vec2(1e-6));
  float l = min(d.x, d.y);
  return 1.0 - smoothstep(0.5 * width_px - 0.5, 0.5 * width_px + 0.5, l);
}
float axis_line(float c, float width_px) {
  float d = abs(c) / max(fwidth(c), 1e-6);
  return 1.0 - smoothstep(0.5 * width_px - 0.5, 0.5 * width_px + 0.5, d);
}
void main() {
  float minor = grid_line(v_uv, 0.25, 1.0) * 0.16;
  float major = grid_line(v_uv, 1.0, 1.3) * 0.45;
  float a = max(minor, major);
  vec3 c = u_color;
  vec2 q = v_uv - u_axis_origin;
  float ax = axis_line(q.y, 2.2);  // the world x axis: where the second coordinate is 0
  float ay = axis_line(q.x, 2.2);
  if (q.x > 0.0 && ax > 0.0) { c = mix(c, u_x_color, ax); a = max(a, 0.75 * ax); }
  if (q.y > 0.0 && ay > 0.0) { c = mix(c, u_y_color, ay); a = max(a, 0.75 * ay); }
  float fade = 1.0 - smoothstep(0.45 * u_extent, u_extent, length(v_uv));
  o_color = vec4(c, a * fade);
}
)";

// Edge-aware smoothing after Lottes 2009 ("FXAA", NVIDIA white paper): find the local edge
// direction from the luma of the four diagonal neighbours, blend along it, and keep the
// wider blend only when its luma stays inside the neighbourhood's range.
inline const char* kPostFragment = R"(#version 330 core
uniform sampler2D u_scene;
uniform vec2 u_origin;   // window pixel of the region's lower-left corner
uniform vec2 u_texel;    // 1 / size
out vec4 o_color;
const vec3 kLuma = vec3(0.299, 0.587, 0.114);
const float kReduceMin = 1.0 / 128.0;
const float kReduceMul = 1.0 / 8.0;
const float kSpanMax = 8.0;
const float kFlat = 1.0 / 24.0;  // luma range below which nothing is smoothed
void main() {
  // The five taps at texel centres are unfiltered fetches (cheap on a software rasteriser);
  // only edge pixels pay for the four filtered taps along the edge.
  ivec2 p = ivec2(gl_FragCoord.xy - u_origin);
  ivec2 hi = textureSize(u_scene, 0) - 1;
  vec3 m = texelFetch(u_scene, p, 0).rgb;
  vec3 nw = texelFetch(u_scene, clamp(p + ivec2(-1, -1), ivec2(0), hi), 0).rgb;
  vec3 ne = texelFetch(u_scene, clamp(p + ivec2(1, -1), ivec2(0), hi), 0).rgb;
  vec3 sw = texelFetch(u_scene, clamp(p + ivec2(-1, 1), ivec2(0), hi), 0).rgb;
  vec3 se = texelFetch(u_scene, clamp(p + ivec2(1, 1), ivec2(0), hi), 0).rgb;
  float lm = dot(m, kLuma), lnw = dot(nw, kLuma), lne = dot(ne, kLuma), lsw = dot(sw, kLuma), lse = dot(se, kLuma);
  float lmin = min(lm, min(min(lnw, lne), min(lsw, lse)));
  float lmax = max(lm, max(max(lnw, lne), max(lsw, lse)));
  if (lmax - lmin < kFlat) { o_color = vec4(m, 1.0); return; }
  vec2 uv = (vec2(p) + 0.5) * u_texel;
  vec2 dir = vec2(-((lnw + lne) - (lsw + lse)), (lnw + lsw) - (lne + lse));
  float reduce = max((lnw + lne + lsw + lse) * 0.25 * kReduceMul, kReduceMin);
  float rcp_min = 1.0 / (min(abs(dir.x), abs(dir.y)) + reduce);
  dir = clamp(dir * rcp_min, vec2(-kSpanMax), vec2(kSpanMax)) * u_texel;
  vec3 a = 0.5 * (texture(u_scene, uv + dir * (1.0 / 3.0 - 0.5)).rgb + texture(u_scene, uv + dir * (2.0 / 3.0 - 0.5)).rgb);
  vec3 b = a * 0.5 + 0.25 * (texture(u_scene, uv - dir * 0.5).rgb + texture(u_scene, uv + dir * 0.5).rgb);
  float lb = dot(b, kLuma);
  o_color = vec4((lb < lmin || lb > lmax) ? a : b, 1.0);
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
