/* A firmware's-eye test of a generic header: includes it, walks every table by its counts and
 * links (presets -> looks -> layers -> stops, controls, channels, fonts, buttons) and exits
 * non-zero on any index out of range, any entry reached twice or never, or any look whose layers
 * (or layer whose stops) are not its own. It prints every value it reads, so two builds of the
 * same header (C and C++, or two versions of the template) can be compared line by line.
 * Written in the common subset of C11 and C++20; compiled both ways by the tests. */
#include <stdio.h>
#include "hb_config.h"

static int failures = 0;
#define CHECK(cond, ...) do { if (!(cond)) { failures++; fprintf(stderr, __VA_ARGS__); fputc('\n', stderr); } } while (0)

/* Counts go through a function so an empty table (count 0) is not "unsigned < 0" to -Wtype-limits. */
static unsigned count_of(unsigned n) { return n; }

static void str(const char *name, const char *s) {
  printf(" %s=", name);
  if (!s) { printf("(null)"); return; }
  for (; *s; s++) printf("%02x", (unsigned)(unsigned char)*s);
}

int main(void) {
  unsigned i, j, k, m;
  unsigned looks_seen = 0, layers_seen = 0, stops_seen = 0;
  const hb_board_t *b = hb_get_board();
  printf("format %s\n", HB_FORMAT);
  CHECK(b->data_pin_count <= 64 && b->input_pin_count <= 64, "board: pin counts over 64");
  str("profile", b->profile);
  for (i = 0; i < b->data_pin_count && i < 64; i++) printf(" d%u", (unsigned)b->data_pins[i]);
  for (i = 0; i < b->input_pin_count && i < 64; i++) printf(" i%u", (unsigned)b->input_pins[i]);
  printf(" max=%u idle=%.17g\n", (unsigned)b->max_pixels_per_pin, b->idle_milliamps);
  {
    const hb_power_t *p = hb_get_power();
    const hb_speaker_t *s = hb_get_speaker();
    printf("power %.17g %.17g %.17g %u %.17g %.17g %.17g %.17g\n", p->cell_capacity_mah, p->cell_nominal_volts, p->cell_max_continuous_amps,
           (unsigned)p->wire_gauge_awg, p->wire_length_mm, p->brightness_cap, p->led_milliamps_per_color, p->pixel_idle_milliamps);
    printf("speaker %.17g %.17g %.17g\n", s->impedance_ohms, s->rated_power_watts, s->amplifier_efficiency);
  }
  for (i = 0; i < count_of(HB_CHANNEL_COUNT); i++) {
    const hb_channel_t *c = hb_channel(i);
    CHECK(c != 0, "channel %u: accessor says out of range", i);
    if (!c) continue;
    printf("channel %u", i); str("id", c->id); str("name", c->name);
    printf(" role=%d px=%u par=%u pin=%u order=%d\n", (int)c->role, (unsigned)c->pixels, (unsigned)c->parallel_strips, (unsigned)c->pin, (int)c->color_order);
  }
  CHECK(hb_channel(HB_CHANNEL_COUNT) == 0, "channel accessor answers past the end");
  for (i = 0; i < count_of(HB_BUTTON_COUNT); i++) {
    const hb_button_t *x = hb_button(i);
    printf("button %u", i); str("id", x->id); str("name", x->name);
    printf(" kind=%d pin=%u\n", (int)x->kind, (unsigned)x->pin);
  }
  CHECK(hb_button(HB_BUTTON_COUNT) == 0, "button accessor answers past the end");
  for (i = 0; i < count_of(HB_FONT_COUNT); i++) {
    const hb_font_t *f = hb_font(i);
    CHECK(f->cue_count <= 10, "font %u: %u cues, over 10", i, (unsigned)f->cue_count);
    printf("font %u", i); str("id", f->id); str("name", f->name); str("folder", f->folder);
    printf(" status=%d cues", (int)f->status);
    for (j = 0; j < f->cue_count && j < 10; j++) printf(" %d", (int)f->cues[j]);
    printf("\n");
  }
  CHECK(hb_font(HB_FONT_COUNT) == 0, "font accessor answers past the end");
  for (i = 0; i < count_of(HB_PRESET_COUNT); i++) {
    const hb_preset_t *p = hb_preset(i);
    CHECK(p->font >= -1 && p->font < (int)HB_FONT_COUNT, "preset %u: font %d out of range", i, (int)p->font);
    CHECK((unsigned)p->first_look + p->look_count <= HB_LOOK_COUNT, "preset %u: looks %u+%u out of range", i, (unsigned)p->first_look, (unsigned)p->look_count);
    CHECK(p->first_look == looks_seen, "preset %u: first look %u, expected %u", i, (unsigned)p->first_look, looks_seen);
    printf("preset %u", i); str("id", p->id); str("name", p->name); str("font_id", p->font_id);
    printf(" font=%d looks=%u+%u\n", (int)p->font, (unsigned)p->first_look, (unsigned)p->look_count);
    for (j = p->first_look; j < (unsigned)p->first_look + p->look_count && j < count_of(HB_LOOK_COUNT); j++) {
      const hb_look_t *l = hb_look(j);
      looks_seen++;
      CHECK(l->preset == i, "look %u: belongs to preset %u, reached from preset %u", j, (unsigned)l->preset, i);
      CHECK(l->channel >= -1 && l->channel < (int)HB_CHANNEL_COUNT, "look %u: channel %d out of range", j, (int)l->channel);
      CHECK((unsigned)l->first_layer + l->layer_count <= HB_LAYER_COUNT, "look %u: layers %u+%u out of range", j, (unsigned)l->first_layer, (unsigned)l->layer_count);
      CHECK(l->first_layer == layers_seen, "look %u: first layer %u, expected %u", j, (unsigned)l->first_layer, layers_seen);
      printf(" look %u", j); str("channel_id", l->channel_id);
      printf(" channel=%d layers=%u+%u\n", (int)l->channel, (unsigned)l->first_layer, (unsigned)l->layer_count);
      for (k = l->first_layer; k < (unsigned)l->first_layer + l->layer_count && k < count_of(HB_LAYER_COUNT); k++) {
        const hb_layer_t *y = hb_layer(k);
        layers_seen++;
        CHECK(y->look == j, "layer %u: belongs to look %u, reached from look %u (a look whose layers are not its own)", k, (unsigned)y->look, j);
        CHECK((unsigned)y->first_stop + y->stop_count <= HB_STOP_COUNT, "layer %u: stops %u+%u out of range", k, (unsigned)y->first_stop, (unsigned)y->stop_count);
        CHECK(y->stop_count == 0 || y->first_stop == stops_seen, "layer %u: first stop %u, expected %u", k, (unsigned)y->first_stop, stops_seen);
        printf("  layer %u kind=%d on=%d op=%.17g blend=%d when=%d range=%d:%u-%u color=%06lx stops=%u+%u band=%u speed=%.17g dir=%d",
               k, (int)y->kind, (int)y->enabled, y->opacity, (int)y->blend, (int)y->when, (int)y->has_range, (unsigned)y->range_start, (unsigned)y->range_end,
               (unsigned long)y->color, (unsigned)y->first_stop, (unsigned)y->stop_count, (unsigned)y->band_pixels, y->speed_pixels_per_second, (int)y->direction);
        printf(" period=%.17g floor=%.17g ceil=%.17g amount=%.17g rate=%.17g event=%d pos=%.17g width=%u decay=%.17g flicker=%.17g dur=%.17g easing=%d",
               y->period_ms, y->floor, y->ceiling, y->amount, y->rate_hz, (int)y->event, y->position, (unsigned)y->width_pixels, y->decay_ms, y->flicker,
               y->duration_ms, (int)y->easing);
        str("mirror", y->channel_id);
        printf(" fit=%d\n", (int)y->fit);
        for (m = y->first_stop; m < (unsigned)y->first_stop + y->stop_count && m < count_of(HB_STOP_COUNT); m++) {
          const hb_stop_t *s = hb_stop(m);
          stops_seen++;
          CHECK(s->layer == k, "stop %u: belongs to layer %u, reached from layer %u", m, (unsigned)s->layer, k);
          printf("   stop %u at=%.17g color=%06lx\n", m, s->at, (unsigned long)s->color);
        }
      }
    }
  }
  CHECK(looks_seen == HB_LOOK_COUNT, "%u of %u looks reached from presets", looks_seen, (unsigned)HB_LOOK_COUNT);
  CHECK(layers_seen == HB_LAYER_COUNT, "%u of %u layers reached from looks", layers_seen, (unsigned)HB_LAYER_COUNT);
  CHECK(stops_seen == HB_STOP_COUNT, "%u of %u stops reached from layers", stops_seen, (unsigned)HB_STOP_COUNT);
  CHECK(hb_preset(HB_PRESET_COUNT) == 0 && hb_look(HB_LOOK_COUNT) == 0 && hb_layer(HB_LAYER_COUNT) == 0 && hb_stop(HB_STOP_COUNT) == 0, "an accessor answers past the end");
  for (i = 0; i < count_of(HB_CONTROL_COUNT); i++) {
    const hb_control_t *c = hb_control(i);
    CHECK(c->input != HB_INPUT_BUTTON || (c->button >= -1 && c->button < (int)HB_BUTTON_COUNT), "control %u: button %d out of range", i, (int)c->button);
    printf("control %u event=%d input=%d", i, (int)c->event, (int)c->input); str("button_id", c->button_id);
    printf(" button=%d gesture=%d motion=%d state=%d\n", (int)c->button, (int)c->gesture, (int)c->motion, (int)c->state);
  }
  CHECK(hb_control(HB_CONTROL_COUNT) == 0, "control accessor answers past the end");
  printf("walked %u looks, %u layers, %u stops; %d problems\n", looks_seen, layers_seen, stops_seen, failures);
  return failures ? 1 : 0;
}
