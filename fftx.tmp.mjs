import { fftInPlace as old } from '/tmp/dg/fft_old.js';
// interleaved DIT radix-2^2, same arithmetic as fft.ts
function mkplan(n){ const bits=Math.round(Math.log2(n)); const sw=[]; for(let i=0;i<n;i++){let r=0;for(let b=0,v=i;b<bits;b++,v>>=1)r=(r<<1)|(v&1); if(r>i)sw.push(i,r);} 
 const tw=new Float64Array(2*n); // stage h at offset 2*(h-4)? store interleaved w1 pairs: per stage pair (h,2h): [w1r,w1i,w2r,w2i,...]
 const cos=new Float64Array(n), sin=new Float64Array(n);
 for(let h=4;h<n;h<<=1) for(let k=0;k<h;k++){const a=-Math.PI*k/h; cos[h-4+k]=Math.cos(a); sin[h-4+k]=Math.sin(a);} 
 // combined table for pairs: offset per h: 4*(h - 4)/... simpler: build map
 const comb=new Map(); for(let h=4;2*h<n;h<<=2){const t=new Float64Array(4*h); for(let k=0;k<h;k++){t[4*k]=cos[h-4+k];t[4*k+1]=sin[h-4+k];t[4*k+2]=cos[2*h-4+k];t[4*k+3]=sin[2*h-4+k];} comb.set(h,t);} 
 return {swaps:Uint32Array.from(sw),cos,sin,comb}; }
const P=new Map();
function fftx(z, inverse){ const n=z.length>>1; let p=P.get(n); if(!p){p=mkplan(n);P.set(n,p);} const {swaps,cos,sin,comb}=p;
 if(!globalThis.NOSWAP) for(let s=0;s<swaps.length;s+=2){const i=2*swaps[s], j=2*swaps[s+1]; let t=z[i]; z[i]=z[j]; z[j]=t; t=z[i+1]; z[i+1]=z[j+1]; z[j+1]=t;}
 const N=2*n;
 for(let a=0;a<N;a+=4){const xr=z[a+2], xi=z[a+3]; z[a+2]=z[a]-xr; z[a+3]=z[a+1]-xi; z[a]+=xr; z[a+1]+=xi;}
 const sg=inverse?-1:1;
 for(let a=0;a<N;a+=8){ let xr=z[a+4], xi=z[a+5]; z[a+4]=z[a]-xr; z[a+5]=z[a+1]-xi; z[a]+=xr; z[a+1]+=xi; xr=sg*z[a+7]; xi=-sg*z[a+6]; z[a+6]=z[a+2]-xr; z[a+7]=z[a+3]-xi; z[a+2]+=xr; z[a+3]+=xi; }
 let h=4;
 for(;2*h<n;h<<=2){ const t=comb.get(h); const H=2*h; const size=8*h;
  for(let start=0;start<N;start+=size){ for(let k=0,kk=0;k<h;k++,kk+=4){ const w1r=t[kk], w1i=sg*t[kk+1], w2r=t[kk+2], w2i=sg*t[kk+3];
    const a0=start+2*k, a1=a0+H, a2=a1+H, a3=a2+H;
    const r1=z[a1], i1=z[a1+1], r3=z[a3], i3=z[a3+1];
    const x1r=r1*w1r-i1*w1i, x1i=r1*w1i+i1*w1r, x3r=r3*w1r-i3*w1i, x3i=r3*w1i+i3*w1r;
    const r0=z[a0], i0=z[a0+1], r2=z[a2], i2=z[a2+1];
    const t0r=r0+x1r,t0i=i0+x1i,t1r=r0-x1r,t1i=i0-x1i,t2r=r2+x3r,t2i=i2+x3i,t3r=r2-x3r,t3i=i2-x3i;
    const c2r=t2r*w2r-t2i*w2i, c2i=t2r*w2i+t2i*w2r; const u3r=t3r*w2r-t3i*w2i, u3i=t3r*w2i+t3i*w2r; const c3r=sg*u3i, c3i=-sg*u3r;
    z[a0]=t0r+c2r; z[a0+1]=t0i+c2i; z[a2]=t0r-c2r; z[a2+1]=t0i-c2i; z[a1]=t1r+c3r; z[a1+1]=t1i+c3i; z[a3]=t1r-c3r; z[a3+1]=t1i-c3i; }}
 }
 if(h<n){const off=h-4; for(let a=0;a<h;a++){const wr=cos[off+a], wi=sg*sin[off+a]; const A=2*a, B=2*(a+h); const br=z[B], bi=z[B+1]; const xr=br*wr-bi*wi, xi=br*wi+bi*wr; z[B]=z[A]-xr; z[B+1]=z[A+1]-xi; z[A]+=xr; z[A+1]+=xi;}}
}
const m=65536; const re=new Float64Array(m), im=new Float64Array(m), z=new Float64Array(2*m);
for(let j=0;j<m;j++){re[j]=Math.sin(j*1.3); im[j]=Math.cos(j*.7); z[2*j]=re[j]; z[2*j+1]=im[j];}
old(re,im); fftx(z,false); let same=true; for(let j=0;j<m;j++) if(re[j]!==z[2*j]||im[j]!==z[2*j+1]) same=false; console.log('same',same);
for(let rep=0;rep<4;rep++){ let t0=performance.now(); for(let i=0;i<100;i++){re.fill(.5);im.fill(.25);old(re,im);} const a=(performance.now()-t0)/100; t0=performance.now(); for(let i=0;i<100;i++){z.fill(.5);fftx(z,false);} const b=(performance.now()-t0)/100; console.log('old',a.toFixed(2),'inter',b.toFixed(2)); }
globalThis.NOSWAP=true;
for(let rep=0;rep<3;rep++){ let t0=performance.now(); for(let i=0;i<100;i++){z.fill(.5);fftx(z,false);} console.log('noswap', ((performance.now()-t0)/100).toFixed(2)); }
globalThis.NOSWAP=false;
for(let rep=0;rep<3;rep++){ let t0=performance.now(); for(let i=0;i<100;i++){z.fill(.5);fftx(z,false);} console.log('swap', ((performance.now()-t0)/100).toFixed(2)); }
