/* Valve driver: a full-on pull-in pulse, then PWM at a holding duty to save battery. */
#include "../include/board.h"

// @timing valve-pwm
// circuit: timer
// clock: SYS_CLOCK_HZ
// prescaler: VALVE_PWM_DIV
// reload: VALVE_PWM_TOP
// compare: VALVE_DUTY_HOLD * (VALVE_PWM_TOP + 1) / 1000
// expect: 20 kHz ±2%
void valve_hold(unsigned valve)
{
    uint32_t compare = (uint32_t)VALVE_DUTY_HOLD * (VALVE_PWM_TOP + 1u) / 1000u;
    pwm_set(valve, VALVE_PWM_DIV, VALVE_PWM_TOP, compare);
}
