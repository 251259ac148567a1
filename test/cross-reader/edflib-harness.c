/*
 * Cross-reader harness over EDFlib (Debian package libedf-dev, a general-purpose EDF/EDF+/BDF/BDF+ library
 * independent of Winnow). Compiled by test/cross-reader/edflib.test.ts into a temporary folder:
 *
 *   gcc -O1 -o edflib-harness edflib-harness.c -ledf
 *
 *   edflib-harness version
 *       prints EDFlib's version number (e.g. 123 for 1.23)
 *   edflib-harness read FILE
 *       prints the header, every signal's parameters, its digital and physical samples, and every annotation
 *       as JSON on stdout, exactly as EDFlib reads them; exit 3 with EDFlib's error code if it refuses the file
 *   edflib-harness write SPEC OUT
 *       writes OUT with EDFlib from the line-based SPEC (see cmd_write below); exit 3 if EDFlib refuses
 *   edflib-harness plain EDFPLUS OUT
 *       derives a plain EDF/BDF from an EDF+/BDF+ file EDFlib wrote (see cmd_plain below)
 *
 * Times in EDFlib are integers in units of 100 ns (EDFLIB_TIME_DIMENSION = 10^7 per second); the harness prints
 * them as given.
 */
#include <edflib.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void json_string(const char *s) {
  putchar('"');
  for (const unsigned char *p = (const unsigned char *)s; *p; p++) {
    if (*p == '"' || *p == '\\') printf("\\%c", *p);
    else if (*p < 0x20) printf("\\u%04x", *p);
    else putchar(*p);
  }
  putchar('"');
}

static int cmd_read(const char *path) {
  static struct edf_hdr_struct h;
  if (edfopen_file_readonly(path, &h, EDFLIB_READ_ALL_ANNOTATIONS) != 0) {
    fprintf(stderr, "edflib refused %s: error code %d\n", path, h.filetype);
    return 3;
  }
  printf("{\"edflibVersion\":%d,\"filetype\":%d,\"edfsignals\":%d,", edflib_version(), h.filetype, h.edfsignals);
  printf("\"fileDuration\":%lld,\"startDate\":[%d,%d,%d],\"startTime\":[%d,%d,%d],\"startSubsecond\":%lld,",
         h.file_duration, h.startdate_year, h.startdate_month, h.startdate_day, h.starttime_hour, h.starttime_minute,
         h.starttime_second, h.starttime_subsecond);
  printf("\"datarecordDuration\":%lld,\"datarecordsInFile\":%lld,\"annotationsInFile\":%lld,", h.datarecord_duration,
         h.datarecords_in_file, h.annotations_in_file);
  printf("\"patient\":");
  json_string(h.patient);
  printf(",\"recording\":");
  json_string(h.recording);
  printf(",\"patientcode\":");
  json_string(h.patientcode);
  printf(",\"signals\":[");
  for (int s = 0; s < h.edfsignals; s++) {
    const struct edf_param_struct *p = &h.signalparam[s];
    printf("%s{\"label\":", s ? "," : "");
    json_string(p->label);
    printf(",\"physdimension\":");
    json_string(p->physdimension);
    printf(",\"prefilter\":");
    json_string(p->prefilter);
    printf(",\"transducer\":");
    json_string(p->transducer);
    printf(",\"physMin\":%.17g,\"physMax\":%.17g,\"digMin\":%d,\"digMax\":%d,\"smpInDatarecord\":%d,\"smpInFile\":%lld,",
           p->phys_min, p->phys_max, p->dig_min, p->dig_max, p->smp_in_datarecord, p->smp_in_file);
    long long n = p->smp_in_file;
    int *dig = malloc(sizeof(int) * (size_t)(n > 0 ? n : 1));
    double *phys = malloc(sizeof(double) * (size_t)(n > 0 ? n : 1));
    if (!dig || !phys) return 4;
    edfseek(h.handle, s, 0, EDFSEEK_SET);
    int got = edfread_digital_samples(h.handle, s, (int)n, dig);
    edfseek(h.handle, s, 0, EDFSEEK_SET);
    int gotp = edfread_physical_samples(h.handle, s, (int)n, phys);
    if (got != n || gotp != n) {
      fprintf(stderr, "edflib read %d/%d of %lld samples of signal %d in %s\n", got, gotp, n, s, path);
      return 3;
    }
    printf("\"digital\":[");
    for (long long k = 0; k < n; k++) printf("%s%d", k ? "," : "", dig[k]);
    printf("],\"physical\":[");
    for (long long k = 0; k < n; k++) printf("%s%.17g", k ? "," : "", phys[k]);
    printf("]}");
    free(dig);
    free(phys);
  }
  printf("],\"annotations\":[");
  for (long long a = 0; a < h.annotations_in_file; a++) {
    struct edf_annotation_struct an;
    if (edf_get_annotation(h.handle, (int)a, &an) != 0) return 3;
    printf("%s{\"onset\":%lld,\"duration\":%lld,\"durationText\":", a ? "," : "", an.onset, an.duration_l);
    json_string(an.duration);
    printf(",\"text\":");
    json_string(an.annotation);
    printf("}");
  }
  printf("]}\n");
  edfclose_file(h.handle);
  return 0;
}

/* The rest of the line after "key " with the newline removed. */
static const char *rest(char *line, size_t keylen) {
  line[strcspn(line, "\r\n")] = 0;
  return strlen(line) > keylen ? line + keylen + 1 : "";
}

#define MAXSIG 64

/*
 * SPEC, one item per line (strings run to the end of the line; times in EDFlib's units):
 *   filetype 0|1|2|3          EDF, EDF+, BDF, BDF+ (EDFLIB_FILETYPE_*)
 *   signals N
 *   records R
 *   duration10us D            data record duration in units of 10 µs (100000 = 1 s)
 *   start Y M D h m s
 *   subsecond S               units of 100 ns
 *   patientname TEXT / recordingadditional TEXT
 *   then per signal:  label TEXT / smp N / physmin X / physmax X / digmin N / digmax N / unit TEXT /
 *                     prefilter TEXT / transducer TEXT   (each applies to the signal last opened by "signal")
 *   signal                    opens the next signal
 *   annotation ONSET DURATION TEXT   onset/duration in units of 100 µs (EDFlib's writer unit), duration −1 = none
 *   data                      followed by whitespace-separated digital samples, record by record,
 *                             signal by signal inside a record
 */
static int cmd_write(const char *specPath, const char *out) {
  FILE *f = fopen(specPath, "r");
  if (!f) {
    fprintf(stderr, "cannot open %s\n", specPath);
    return 2;
  }
  char line[1024];
  int filetype = 1, ns = 0, records = 0, d10 = 100000, subsecond = 0, sig = -1;
  int start[6] = {2026, 1, 1, 0, 0, 0};
  char label[MAXSIG][64], unit[MAXSIG][16], pre[MAXSIG][96], trans[MAXSIG][96];
  double pmin[MAXSIG], pmax[MAXSIG];
  int dmin[MAXSIG], dmax[MAXSIG], smp[MAXSIG];
  long long aon[256], adur[256];
  char atext[256][256];
  int nann = 0;
  char patient[96] = "", recadd[96] = "";
  while (fgets(line, sizeof line, f)) {
    if (!strncmp(line, "data", 4)) break;
    if (!strncmp(line, "filetype ", 9)) filetype = atoi(line + 9);
    else if (!strncmp(line, "signals ", 8)) ns = atoi(line + 8);
    else if (!strncmp(line, "records ", 8)) records = atoi(line + 8);
    else if (!strncmp(line, "duration10us ", 13)) d10 = atoi(line + 13);
    else if (!strncmp(line, "subsecond ", 10)) subsecond = atoi(line + 10);
    else if (!strncmp(line, "start ", 6))
      sscanf(line + 6, "%d %d %d %d %d %d", &start[0], &start[1], &start[2], &start[3], &start[4], &start[5]);
    else if (!strncmp(line, "patientname ", 12)) snprintf(patient, sizeof patient, "%s", rest(line, 11));
    else if (!strncmp(line, "recordingadditional ", 20)) snprintf(recadd, sizeof recadd, "%s", rest(line, 19));
    else if (!strncmp(line, "signal", 6) && (line[6] == '\n' || line[6] == 0 || line[6] == '\r')) {
      if (++sig >= MAXSIG) return 2;
      label[sig][0] = unit[sig][0] = pre[sig][0] = trans[sig][0] = 0;
    } else if (sig >= 0 && !strncmp(line, "label ", 6)) snprintf(label[sig], 64, "%s", rest(line, 5));
    else if (sig >= 0 && !strncmp(line, "unit ", 5)) snprintf(unit[sig], 16, "%s", rest(line, 4));
    else if (sig >= 0 && !strncmp(line, "prefilter ", 10)) snprintf(pre[sig], 96, "%s", rest(line, 9));
    else if (sig >= 0 && !strncmp(line, "transducer ", 11)) snprintf(trans[sig], 96, "%s", rest(line, 10));
    else if (sig >= 0 && !strncmp(line, "smp ", 4)) smp[sig] = atoi(line + 4);
    else if (sig >= 0 && !strncmp(line, "physmin ", 8)) pmin[sig] = atof(line + 8);
    else if (sig >= 0 && !strncmp(line, "physmax ", 8)) pmax[sig] = atof(line + 8);
    else if (sig >= 0 && !strncmp(line, "digmin ", 7)) dmin[sig] = atoi(line + 7);
    else if (sig >= 0 && !strncmp(line, "digmax ", 7)) dmax[sig] = atoi(line + 7);
    else if (!strncmp(line, "annotation ", 11) && nann < 256) {
      int used = 0;
      sscanf(line + 11, "%lld %lld %n", &aon[nann], &adur[nann], &used);
      char *t = line + 11 + used;
      t[strcspn(t, "\r\n")] = 0;
      snprintf(atext[nann], 256, "%s", t);
      nann++;
    }
  }
  if (ns != sig + 1 || ns < 1) {
    fprintf(stderr, "spec gives signals %d but defines %d\n", ns, sig + 1);
    return 2;
  }
  int h = edfopen_file_writeonly(out, filetype, ns);
  if (h < 0) {
    fprintf(stderr, "edflib cannot open %s for writing: %d\n", out, h);
    return 3;
  }
  int bad = 0;
  bad |= edf_set_datarecord_duration(h, d10);
  bad |= edf_set_startdatetime(h, start[0], start[1], start[2], start[3], start[4], start[5]);
  if (subsecond) bad |= edf_set_subsecond_starttime(h, subsecond);
  if (patient[0]) bad |= edf_set_patientname(h, patient);
  if (recadd[0]) bad |= edf_set_recording_additional(h, recadd);
  for (int s = 0; s < ns; s++) {
    bad |= edf_set_samplefrequency(h, s, smp[s]);
    bad |= edf_set_physical_minimum(h, s, pmin[s]);
    bad |= edf_set_physical_maximum(h, s, pmax[s]);
    bad |= edf_set_digital_minimum(h, s, dmin[s]);
    bad |= edf_set_digital_maximum(h, s, dmax[s]);
    bad |= edf_set_label(h, s, label[s]);
    bad |= edf_set_physical_dimension(h, s, unit[s]);
    if (pre[s][0]) bad |= edf_set_prefilter(h, s, pre[s]);
    if (trans[s][0]) bad |= edf_set_transducer(h, s, trans[s]);
  }
  if (bad) {
    fprintf(stderr, "edflib refused a header parameter\n");
    return 3;
  }
  for (int r = 0; r < records; r++) {
    for (int s = 0; s < ns; s++) {
      int buf[65536];
      for (int k = 0; k < smp[s]; k++)
        if (fscanf(f, "%d", &buf[k]) != 1) {
          fprintf(stderr, "spec data ends early (record %d, signal %d)\n", r, s);
          return 2;
        }
      if (edfwrite_digital_samples(h, buf) != 0) {
        fprintf(stderr, "edflib refused samples of record %d, signal %d\n", r, s);
        return 3;
      }
    }
  }
  for (int a = 0; a < nann; a++)
    if (edfwrite_annotation_utf8(h, aon[a], adur[a], atext[a]) != 0) {
      fprintf(stderr, "edflib refused annotation %d\n", a);
      return 3;
    }
  fclose(f);
  return edfclose_file(h) == 0 ? 0 : 3;
}

/*
 * EDFlib 1.23 writes only EDF+ and BDF+ (edflib.h: "filetype must be EDFLIB_FILETYPE_EDFPLUS or
 * EDFLIB_FILETYPE_BDFPLUS"). A plain EDF/BDF is derived from such a file as the EDF+ specification relates the
 * two [Kemp & Olivan 2003 §2.1]: the annotation signal is dropped from the signal header and from every data
 * record, the reserved field is blanked and ns and the header size are set again. The test then has EDFlib
 * read the plain file, so it is a file the library accepts.
 */
static int cmd_plain(const char *in, const char *out) {
  FILE *f = fopen(in, "rb");
  if (!f) return 2;
  fseek(f, 0, SEEK_END);
  long size = ftell(f);
  fseek(f, 0, SEEK_SET);
  unsigned char *b = malloc((size_t)size);
  if (!b || fread(b, 1, (size_t)size, f) != (size_t)size) return 2;
  fclose(f);
  char tmp[16];
  memcpy(tmp, b + 252, 4);
  tmp[4] = 0;
  int ns = atoi(tmp);
  int bps = b[0] == 0xff ? 3 : 2;
  const unsigned char *sh = b + 256;
  int ann = -1, spr[MAXSIG];
  for (int j = 0; j < ns && j < MAXSIG; j++) {
    if (!memcmp(sh + 16 * j, "EDF Annotations", 15) || !memcmp(sh + 16 * j, "BDF Annotations", 15)) ann = j;
    memcpy(tmp, sh + 216 * ns + 8 * j, 8);
    tmp[8] = 0;
    spr[j] = atoi(tmp);
  }
  if (ann < 0) return 2;
  int nns = ns - 1;
  long hdr = 256L * (ns + 1), nhdr = 256L * (nns + 1), rec = 0, nrec = 0;
  for (int j = 0; j < ns; j++) rec += (long)spr[j] * bps;
  nrec = rec - (long)spr[ann] * bps;
  long records = (size - hdr) / rec;
  unsigned char *o = calloc(1, (size_t)(nhdr + records * nrec));
  if (!o) return 2;
  memcpy(o, b, 256);
  memset(o + 192, ' ', 44);
  char num[16];
  snprintf(num, sizeof num, "%-8ld", nhdr);
  memcpy(o + 184, num, 8);
  snprintf(num, sizeof num, "%-4d", nns);
  memcpy(o + 252, num, 4);
  static const int width[10] = {16, 80, 8, 8, 8, 8, 8, 80, 8, 32};
  long src = 0, dst = 0;
  for (int fi = 0; fi < 10; fi++) {
    for (int j = 0; j < ns; j++)
      if (j != ann) {
        memcpy(o + 256 + dst, sh + src + (long)width[fi] * j, (size_t)width[fi]);
        dst += width[fi];
      }
    src += (long)width[fi] * ns;
  }
  for (long r = 0; r < records; r++) {
    const unsigned char *rp = b + hdr + r * rec;
    unsigned char *op = o + nhdr + r * nrec;
    long at = 0, ot = 0;
    for (int j = 0; j < ns; j++) {
      long n = (long)spr[j] * bps;
      if (j != ann) {
        memcpy(op + ot, rp + at, (size_t)n);
        ot += n;
      }
      at += n;
    }
  }
  FILE *w = fopen(out, "wb");
  if (!w || fwrite(o, 1, (size_t)(nhdr + records * nrec), w) != (size_t)(nhdr + records * nrec)) return 2;
  fclose(w);
  free(b);
  free(o);
  return 0;
}

int main(int argc, char **argv) {
  if (argc == 2 && !strcmp(argv[1], "version")) {
    printf("%d\n", edflib_version());
    return 0;
  }
  if (argc == 3 && !strcmp(argv[1], "read")) return cmd_read(argv[2]);
  if (argc == 4 && !strcmp(argv[1], "write")) return cmd_write(argv[2], argv[3]);
  if (argc == 4 && !strcmp(argv[1], "plain")) return cmd_plain(argv[2], argv[3]);
  fprintf(stderr, "usage: edflib-harness version | read FILE | write SPEC OUT | plain EDFPLUS OUT\n");
  return 2;
}
