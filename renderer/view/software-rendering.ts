// Whether the page's WebGL runs in software (SwiftShader, llvmpipe) rather than on a graphics
// chip. Pliant needs no GPU, and without one every pixel is computed by the CPU: the stage then
// skips multisampling, which would multiply that work several times over for smoother edges.

const SOFTWARE_RENDERERS = /swiftshader|llvmpipe|softpipe|software/i;

let cached: boolean | undefined;

export function isSoftwareRendering(): boolean {
  if (cached !== undefined) return cached;
  const probe = document.createElement('canvas');
  const gl = probe.getContext('webgl2') ?? probe.getContext('webgl');
  if (!gl) return (cached = true);
  const info = gl.getExtension('WEBGL_debug_renderer_info');
  const renderer = String(info ? gl.getParameter(info.UNMASKED_RENDERER_WEBGL) : gl.getParameter(gl.RENDERER));
  gl.getExtension('WEBGL_lose_context')?.loseContext();
  return (cached = SOFTWARE_RENDERERS.test(renderer));
}
