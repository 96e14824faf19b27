// SVG to PNG through librsvg and cairo; the PNG is collected in memory, never written here.
#include "report/png_export.h"

#include <cairo.h>
#include <librsvg/rsvg.h>

#include <cmath>
#include <memory>
#include <stdexcept>

namespace edgeflux {
namespace {

cairo_status_t append_to_string(void* closure, const unsigned char* data, unsigned int length) {
  static_cast<std::string*>(closure)->append(reinterpret_cast<const char*>(data), length);
  return CAIRO_STATUS_SUCCESS;
}

}  // namespace

std::string png_from_svg(const std::string& svg, double dpi) {
  GError* error = nullptr;
  std::unique_ptr<RsvgHandle, decltype(&g_object_unref)> handle(
      rsvg_handle_new_from_data(reinterpret_cast<const guint8*>(svg.data()), svg.size(), &error), g_object_unref);
  if (!handle) {
    const std::string message = error ? error->message : "unknown error";
    if (error) g_error_free(error);
    throw std::runtime_error("PNG export: librsvg cannot read the drawing: " + message);
  }
  rsvg_handle_set_dpi(handle.get(), dpi);
  gdouble width = 0, height = 0;
  if (!rsvg_handle_get_intrinsic_size_in_pixels(handle.get(), &width, &height) || width <= 0 || height <= 0)
    throw std::runtime_error("PNG export: the drawing has no absolute size");
  const int w = static_cast<int>(std::ceil(width)), h = static_cast<int>(std::ceil(height));
  std::unique_ptr<cairo_surface_t, decltype(&cairo_surface_destroy)> surface(cairo_image_surface_create(CAIRO_FORMAT_ARGB32, w, h),
                                                                             cairo_surface_destroy);
  std::unique_ptr<cairo_t, decltype(&cairo_destroy)> cr(cairo_create(surface.get()), cairo_destroy);
  // A white page under the drawing, as on paper.
  cairo_set_source_rgb(cr.get(), 1, 1, 1);
  cairo_paint(cr.get());
  const RsvgRectangle viewport{0, 0, static_cast<double>(w), static_cast<double>(h)};
  if (!rsvg_handle_render_document(handle.get(), cr.get(), &viewport, &error)) {
    const std::string message = error ? error->message : "unknown error";
    if (error) g_error_free(error);
    throw std::runtime_error("PNG export: librsvg cannot render the drawing: " + message);
  }
  cairo_surface_flush(surface.get());
  std::string png;
  if (cairo_surface_write_to_png_stream(surface.get(), append_to_string, &png) != CAIRO_STATUS_SUCCESS)
    throw std::runtime_error("PNG export: cairo cannot encode the image");
  return png;
}

}  // namespace edgeflux
