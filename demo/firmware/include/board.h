/* Rillwell GV-4 board definitions: clocks and timer settings shared by all modules. */
#ifndef GV4_BOARD_H
#define GV4_BOARD_H

#include <stdint.h>

/* 8 MHz crystal, PLL x2. */
#define XTAL_CLOCK_HZ     8000000u
#define PLL_MULTIPLIER    2u
#define SYS_CLOCK_HZ      (XTAL_CLOCK_HZ * PLL_MULTIPLIER)

/* Slow on-chip RC oscillator feeding the watchdog. */
#define SLOW_OSC_HZ       32000u
#define WATCHDOG_DIV      16u
#define WATCHDOG_TOP      3999u

/* Scheduler tick: SYS_CLOCK_HZ / TICK_DIV / (TICK_TOP + 1). */
#define TICK_DIV          64u
#define TICK_TOP          249u

/* Valve driver PWM: raised from 799 in rev B to cut switching losses. */
#define VALVE_PWM_DIV     1u
#define VALVE_PWM_TOP     999u

enum valve_duty {
    VALVE_DUTY_PULL_IN = 1000,   /* 100 % for the pull-in pulse */
    VALVE_DUTY_HOLD = 350,       /* holding current */
    VALVE_DUTY_OFF = 0
};

/* Radio module UART. */
#define RADIO_BAUD        9600u
#define UART_OVERSAMPLING 16u
#define UART_DIVISOR      ((SYS_CLOCK_HZ + (UART_OVERSAMPLING * RADIO_BAUD) / 2u) / (UART_OVERSAMPLING * RADIO_BAUD))

#endif
