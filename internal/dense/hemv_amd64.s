#include "textflag.h"

// func hemvRowAVX(n int, rr, ri, xr, xi, yr, yi *float64, sr, si float64) (dr, di float64)
//
// For c < n (n a multiple of 4), with a = rr[c] + i·ri[c], x = xr + i·xi:
// (dr + i·di) += conj(a)·x[c]; y[c] += a·(sr + i·si).
TEXT ·hemvRowAVX(SB), NOSPLIT, $0-88
	MOVQ         n+0(FP), CX
	MOVQ         rr+8(FP), SI
	MOVQ         ri+16(FP), DI
	MOVQ         xr+24(FP), R8
	MOVQ         xi+32(FP), R9
	MOVQ         yr+40(FP), R10
	MOVQ         yi+48(FP), R11
	VBROADCASTSD sr+56(FP), Y8
	VBROADCASTSD si+64(FP), Y9
	VXORPD       Y0, Y0, Y0
	VXORPD       Y1, Y1, Y1
	SHRQ         $2, CX
	JEQ          hdone

hloop:
	VMOVUPD      (SI), Y2
	VMOVUPD      (DI), Y3
	VMOVUPD      (R8), Y4
	VMOVUPD      (R9), Y5
	VFMADD231PD  Y4, Y2, Y0
	VFMADD231PD  Y5, Y3, Y0
	VFMADD231PD  Y5, Y2, Y1
	VFNMADD231PD Y4, Y3, Y1
	VMOVUPD      (R10), Y6
	VMOVUPD      (R11), Y7
	VFMADD231PD  Y8, Y2, Y6
	VFNMADD231PD Y9, Y3, Y6
	VFMADD231PD  Y9, Y2, Y7
	VFMADD231PD  Y8, Y3, Y7
	VMOVUPD      Y6, (R10)
	VMOVUPD      Y7, (R11)
	ADDQ         $32, SI
	ADDQ         $32, DI
	ADDQ         $32, R8
	ADDQ         $32, R9
	ADDQ         $32, R10
	ADDQ         $32, R11
	DECQ         CX
	JNZ          hloop

hdone:
	VEXTRACTF128 $1, Y0, X2
	VADDPD       X2, X0, X0
	VHADDPD      X0, X0, X0
	VEXTRACTF128 $1, Y1, X3
	VADDPD       X3, X1, X1
	VHADDPD      X1, X1, X1
	VZEROUPPER
	MOVSD        X0, dr+72(FP)
	MOVSD        X1, di+80(FP)
	RET
