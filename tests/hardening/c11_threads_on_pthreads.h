/* SPDX-License-Identifier: Apache-2.0 */
/* C11 threads on POSIX threads, for the ThreadSanitizer run of the C interface
 * test (tests/hardening, docs/reliability.md). glibc's thrd_create() starts its
 * thread without the pthread_create() that ThreadSanitizer intercepts (clang 14,
 * gcc 12), so an instrumented program crashes in the new thread; force-included
 * (-include) into tests/c/test_c_api.c in the TSan tree only, this maps
 * thrd_create/thrd_join onto pthread_create/pthread_join. */
#ifndef QUANTACAL_TESTS_HARDENING_C11_THREADS_ON_PTHREADS_H
#define QUANTACAL_TESTS_HARDENING_C11_THREADS_ON_PTHREADS_H

#include <pthread.h>
#include <stdint.h>
#include <stdlib.h>
#include <threads.h>

typedef struct {
  thrd_start_t function;
  void* argument;
} quantacal_thrd_start;

static void* quantacal_thrd_trampoline(void* p) {
  quantacal_thrd_start start = *(quantacal_thrd_start*)p;
  free(p);
  return (void*)(intptr_t)start.function(start.argument);
}

static inline int quantacal_thrd_create(thrd_t* thread, thrd_start_t function,
                                        void* argument) {
  quantacal_thrd_start* start = (quantacal_thrd_start*)malloc(sizeof *start);
  if (!start)
    return thrd_nomem;
  start->function = function;
  start->argument = argument;
  if (pthread_create(thread, NULL, quantacal_thrd_trampoline, start) != 0) {
    free(start);
    return thrd_error;
  }
  return thrd_success;
}

static inline int quantacal_thrd_join(thrd_t thread, int* result) {
  void* value = NULL;
  if (pthread_join(thread, &value) != 0)
    return thrd_error;
  if (result)
    *result = (int)(intptr_t)value;
  return thrd_success;
}

#define thrd_create quantacal_thrd_create
#define thrd_join quantacal_thrd_join

#endif
